using System.Globalization;
using System.Text.Json;
using LoopShaper.Core.Corners;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The Monte Carlo panel: progress, cancel within 100 ms, the results as the core gives them, opening a sample. Run
/// alone (not beside the other test classes) so that the stop latency measures the run, not this project's own load.
/// </summary>
[Collection(MonteCarloPanelTests.Alone)]
public sealed class MonteCarloPanelTests : BunitContext
{
    /// <summary>Name of the collection that runs without parallel neighbours.</summary>
    public const string Alone = "monte-carlo-alone";

    public MonteCarloPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        Services.AddLogging();
    }

    [Fact]
    public async Task Cancelling_a_long_run_stops_it_within_100_ms_and_the_panel_runs_again()
    {
        PlotlyModule.Setup(this);
        var workspace = await Workspace();
        var cut = Render<MonteCarloPanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Threads, 1));
        cut.Find("[data-mc-samples]").Change("100000");
        cut.Find("[data-mc-run]").Click();
        var run = cut.Instance.Run;
        Eventually.True(() => run.Progress > 0, "progress from the core");
        cut.WaitForAssertion(() => Assert.NotNull(cut.Find("[data-mc-progress]")));
        Assert.True(run.IsRunning);

        cut.Find("[data-mc-cancel]").Click();
        await run.Completion.WaitAsync(TimeSpan.FromSeconds(30));

        // The requirement: cancelling a long Monte Carlo stops it within 100 ms, measured by the runner from the
        // cancel request to the end of sampling; the background run times the return with the partial result after it.
        Assert.Equal(RunState.Cancelled, run.State);
        Assert.NotNull(run.StopLatency);
        var partial = run.Result!;
        Assert.True(partial.Cancelled);
        Assert.NotNull(partial.CancelStopS);
        Assert.True(partial.CancelStopS < 0.1, $"sampling stopped {1000 * partial.CancelStopS:F1} ms after the request");
        Assert.True(run.StopLatency!.Value.TotalSeconds >= partial.CancelStopS, "the run ended before its sampling stopped");
        cut.WaitForAssertion(() => Assert.Contains("cancelled: sampling stopped", cut.Find("[data-mc-status]").TextContent, StringComparison.Ordinal));
        Assert.InRange(partial.Completed, 1, MonteCarloSettings.MaxSamples - 1);
        cut.WaitForAssertion(() => Assert.Contains("cancelled after", cut.Find(".mc-summary").TextContent, StringComparison.Ordinal));

        // Usable after: a short run finishes and shows its yield.
        cut.Find("[data-mc-samples]").Change("50");
        cut.Find("[data-mc-run]").Click();
        Eventually.True(() => run.State == RunState.Finished, "the second run");
        var result = run.Result!;
        Assert.Equal(50, result.Completed);
        cut.WaitForAssertion(() => Assert.Equal(result.YieldPct.ToString("F1", CultureInfo.InvariantCulture) + " %", cut.Find("[data-mc-yield]").TextContent));
    }

    [Fact]
    public async Task The_histograms_are_the_cores_bins_and_the_same_seed_gives_the_same_run()
    {
        var module = PlotlyModule.Setup(this);
        var workspace = await Workspace();
        var cut = Render<MonteCarloPanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Threads, 1));
        cut.Find("[data-mc-samples]").Change("200");
        cut.Find("[data-mc-seed]").Change("7");
        cut.Find("[data-mc-distribution]").Change(SampleDistribution.Normal.ToString());
        cut.Find("[data-mc-run]").Click();
        var run = cut.Instance.Run;
        Eventually.True(() => run.State == RunState.Finished, "the run");
        Eventually.True(() => PlotlyModule.Calls(module).Any(i => i.Identifier == "newPlot" && Equals(i.Arguments[0], "mc-histogram-chart")), "the histograms");
        var result = run.Result!;
        Assert.Equal(SampleDistribution.Normal, result.Settings.Distribution);
        Assert.Equal(7UL, result.Settings.Seed);

        using var data = JsonDocument.Parse(JsonSerializer.Serialize(PlotlyModule.Calls(module).Last(i => i.Identifier == "newPlot" && Equals(i.Arguments[0], "mc-histogram-chart")).Arguments[1]));
        var bars = data.RootElement.EnumerateArray().Where(t => t.GetProperty("type").GetString() == "bar").ToList();
        Assert.Equal(HistogramFigure.Panels.Count(p => result.Distribution(p.Figure) is not null), bars.Count);
        var pm = bars.Single(b => b.GetProperty("name").GetString() == "phaseMarginDeg");
        var d = result.Distribution("phaseMarginDeg")!;
        Assert.Equal(d.HistogramCounts, pm.GetProperty("y").EnumerateArray().Select(v => v.GetInt32()));
        Assert.Equal(d.Count, pm.GetProperty("y").EnumerateArray().Sum(v => v.GetInt32())); // every sample with a phase margin is in a bin
        Assert.Equal(d.HistogramStart + (0.5 * d.HistogramBinWidth), pm.GetProperty("x")[0].GetDouble(), 1e-5 * Math.Abs(d.HistogramStart) + 1e-9);

        // The median shown is the core's, and a second run with the same seed gives the same samples (seeded, reproducible).
        string median = cut.Find("[data-mc-figure='phaseMarginDeg']").Children[4].TextContent;
        Assert.Equal(d.P50.ToString("F1", CultureInfo.InvariantCulture) + " °", median);
        cut.Find("[data-mc-run]").Click();
        Eventually.True(() => run.State == RunState.Finished && !ReferenceEquals(run.Result, result), "the repeated run");
        Assert.Equal(result.PassedCount, run.Result!.PassedCount);
        Assert.Equal(d.P50, run.Result.Distribution("phaseMarginDeg")!.P50);
    }

    [Fact]
    public async Task A_worst_sample_opens_as_the_design_only_on_click_and_the_previous_design_comes_back()
    {
        PlotlyModule.Setup(this);
        var workspace = await Workspace();
        string name = workspace.Form.Name;
        double inductance = workspace.Form.Inductance.Value!.Value;
        var cut = Render<MonteCarloPanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Threads, 1));
        cut.Find("[data-mc-samples]").Change("40");
        cut.Find("[data-mc-run]").Click();
        Eventually.True(() => cut.Instance.Run.State == RunState.Finished, "the run");
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-mc-open]")));
        Assert.Equal(name, workspace.Form.Name); // a finished run changes nothing by itself

        var result = cut.Instance.Run.Result!;
        var sample = result.WorstSamples[0];
        int l = result.Parameters.IndexOf(result.Parameters.Single(p => p.Kind == ToleranceKind.Inductance));
        cut.WaitForAssertion(() => cut.Find($"[data-mc-open='{sample.Index}']").Click()); // found and clicked in one go: progress renders may replace the row
        Eventually.True(() => workspace.Form.Name.EndsWith("sample " + sample.Index, StringComparison.Ordinal), "the sample opened");

        // The opened design carries the sample's parameter values (entered value x factor, the core's ToDesign).
        Assert.Equal(sample.Values[l], workspace.Form.Inductance.Value!.Value, 1e-12 * sample.Values[l]);
        Assert.NotEqual(inductance, workspace.Form.Inductance.Value!.Value);

        cut.WaitForAssertion(() => cut.Find("[data-mc-restore]").Click());
        Eventually.True(() => workspace.Form.Name == name, "the previous design back");
        Assert.Equal(inductance, workspace.Form.Inductance.Value!.Value);
    }

    [Fact]
    public void Unreadable_inputs_are_named_with_the_allowed_range()
    {
        var request = new MonteCarloRequest { SamplesText = "200000", SeedText = "-3" };
        Assert.Equal("Samples: '200000' is not a whole number from 1 to 100,000.", request.SamplesError);
        Assert.Equal("Seed: '-3' is not a whole number from 0 to 18446744073709551615.", request.SeedError);
        Assert.Null(request.ToSettings(1));
        request.SamplesText = "100,000";
        request.SeedText = "42";
        Assert.Equal(100_000, request.ToSettings(1)!.Samples);
    }

    private static async Task<DesignWorkspace> Workspace()
    {
        var workspace = new DesignWorkspace(TestDesigns.Demo, NullLogger.Instance);
        await workspace.RecomputeAsync();
        return workspace;
    }
}

/// <summary>Runs <see cref="MonteCarloPanelTests"/> with no other test class in parallel.</summary>
[CollectionDefinition(MonteCarloPanelTests.Alone, DisableParallelization = true)]
public sealed class MonteCarloAloneGroup;
