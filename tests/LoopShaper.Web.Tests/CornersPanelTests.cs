using System.Globalization;
using System.Text.Json;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LoopShaper.Web.Tests;

/// <summary>The corner panel: the sweep in the background, the table with the worst corner per figure, the overlay sent to Plotly.</summary>
public sealed class CornersPanelTests : BunitContext
{
    public CornersPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        Services.AddLogging();
    }

    [Fact]
    public void The_sweep_lists_every_corner_and_outlines_the_smallest_phase_margin()
    {
        PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        using var watch = Watch();
        var cut = Render<CornersPanel>(p => p.Add(c => c.Watch, watch));
        Assert.Empty(cut.FindAll("[data-corner-row]")); // no table before the first sweep
        _ = watch.Follow(analysis);

        Eventually.True(() => cut.Instance.Run.State == RunState.Finished, "the corner sweep");
        cut.WaitForAssertion(() => Assert.Equal(CornerSet.Full.Length, cut.FindAll("[data-corner-row]").Count));
        var table = cut.Instance.Table!;

        // The outlined phase-margin cell is the smallest phase margin of all rows, as shown.
        var worst = cut.Find("[data-cell='pm'][data-worst='true']");
        double smallest = table.Rows.Where(r => r.Figures?.PhaseMarginDeg is not null).Min(r => r.Figures!.PhaseMarginDeg!.Value);
        Assert.Equal(smallest.ToString("F1", CultureInfo.InvariantCulture) + " °", worst.TextContent);
        Assert.Single(cut.FindAll("[data-cell='crossover'][data-worst='true']"));

        // Cross-method agreement: the corner of the main analysis (nominal input, full load, nominal parts; the demo has
        // no DC-bias derating, so every factor is 1) has the main analysis's phase margin (same margin search, its own grid).
        int main = table.Rows.IndexOf(table.Rows.Single(r => r.Corner == new CornerPoint(InputCorner.Nominal, LoadCorner.Max, ToleranceSet.Nominal)));
        Assert.Equal(analysis.Margins!.PhaseMarginDeg!.Value, table.Rows[main].Figures!.PhaseMarginDeg!.Value, 0.01);
        string shown = cut.Find($"[data-corner-row='{main}'] [data-cell='pm']").TextContent;
        Assert.Equal(table.Rows[main].Figures!.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture) + " °", shown);

        // Each row's verdict is the core's.
        foreach (var i in new[] { 0, main, table.Rows.Length - 1 })
        {
            Assert.StartsWith(table.Rows[i].Passed ? "pass" : "fail", cut.Find($"[data-corner-row='{i}'] [data-cell='verdict']").TextContent.Trim(), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void The_overlay_draws_every_corner_and_the_worst_on_top()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        using var watch = Watch();
        var cut = Render<CornersPanel>(p => p.Add(c => c.Watch, watch));
        _ = watch.Follow(analysis);
        Eventually.True(() => PlotlyModule.Calls(module).Any(i => i.Identifier == "newPlot" && Equals(i.Arguments[0], "corner-bode-chart")), "the overlay");

        var table = cut.Instance.Table!;
        var call = PlotlyModule.Calls(module).Last(i => i.Identifier is "newPlot" or "react" && Equals(i.Arguments[0], "corner-bode-chart"));
        using var data = JsonDocument.Parse(JsonSerializer.Serialize(call.Arguments[1]));
        var traces = data.RootElement.EnumerateArray().ToList();
        int withResponse = table.Rows.Count(r => r.LoopResponse is not null);
        Assert.Equal(2 * withResponse, traces.Count); // magnitude and phase per corner

        // The last pair is the corner with the smallest phase margin, drawn last so that it is on top.
        var worstRow = table.Rows[table.Worst.PhaseMargin!.Value];
        Assert.Equal($"{CornerBodeFigure.WorstName}: {worstRow.Corner.Label}", traces[^2].GetProperty("name").GetString());
        Assert.Equal(ChartPalette.Margin, traces[^2].GetProperty("line").GetProperty("color").GetString());
        double[] x = [.. traces[^2].GetProperty("x").EnumerateArray().Select(v => v.GetDouble())];
        double[] y = [.. traces[^2].GetProperty("y").EnumerateArray().Select(v => v.GetDouble())];
        var r = worstRow.LoopResponse!;
        for (int i = 0; i < x.Length; i += 5)
        {
            int j = Enumerable.Range(0, r.Count).MinBy(k => Math.Abs(r.FrequencyHz[k] - x[i]));
            Assert.Equal(r.MagnitudeDb[j], y[i], 1e-2); // the core's loop gain at that corner, rounded to 0.01 dB for drawing
        }

        Assert.DoesNotContain("NaN", data.RootElement.GetRawText(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Changes_in_quick_succession_are_swept_once_for_the_latest_design_and_an_invalid_one_is_not_swept()
    {
        using var watch = new CornerWatch(Services.GetRequiredService<ILoggerFactory>().CreateLogger("corners")) { SettleMs = 200, Threads = 1 };
        var first = TestDesigns.DemoAnalysis;
        var latest = first with { };
        var pending = watch.Follow(first);
        var last = watch.Follow(latest);
        _ = watch.Follow(first with { Loop = null }); // input errors: IsValid is false, nothing to sweep
        await Task.WhenAll(pending, last);

        Assert.Same(latest, watch.SweptFrom);
        Assert.True(watch.IsCurrentFor(latest));
        Assert.False(watch.IsCurrentFor(first));
        Assert.Equal(CornerSet.Full.Length, watch.Table!.Rows.Length);
    }

    [Fact]
    public async Task The_summary_judges_the_same_corner_table_as_the_corners_card()
    {
        PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        using var watch = Watch();
        var cut = Render<SummaryPanel>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Corners, watch));
        Assert.Equal("pending", cut.Find("[data-summary-corners]").GetAttribute("data-summary-corners"));

        await watch.Follow(analysis);
        cut.Render();
        var table = watch.Table!;
        string state = table.AllPass ? "pass" : "fail";
        Assert.Equal(state, cut.Find("[data-summary-corners]").GetAttribute("data-summary-corners"));
        string text = cut.Find("[data-summary-corners]").TextContent;
        Assert.Contains(table.AllPass ? $"All {table.Rows.Length} corners meet the criteria" : $"{table.Failing.Count()} of {table.Rows.Length} corners miss a criterion", text, StringComparison.Ordinal);
        var worst = table.Rows[table.Worst.PhaseMargin!.Value];
        Assert.Contains($"smallest phase margin {worst.Figures!.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture)} ° at {worst.Corner.Label}", text, StringComparison.Ordinal);

        // The verdict above it says where the criteria list was checked.
        Assert.Contains("at the analysed point", cut.Find("[data-verdict]").TextContent, StringComparison.Ordinal);
    }

    private CornerWatch Watch() => new(Services.GetRequiredService<ILoggerFactory>().CreateLogger("corners")) { SettleMs = 0, Threads = 1 };
}
