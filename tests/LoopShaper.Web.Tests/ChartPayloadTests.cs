using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;

namespace LoopShaper.Web.Tests;

/// <summary>What the charts send to Plotly, checked call by call in strict JS interop mode.</summary>
public sealed class ChartPayloadTests : BunitContext
{
    public ChartPayloadTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
    }

    [Fact]
    public void Bode_chart_imports_the_plotly_module_once_and_draws_the_core_response()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var form = DesignForm.FromDesign(analysis.Design);

        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Form, form));

        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        Assert.Single(PlotlyModule.Calls(JSInterop), i => i.Identifier == "import");
        Assert.Single(module.Invocations["importScript"]);

        var call = module.Invocations["newPlot"].Single();
        Assert.Equal("bode-chart", call.Arguments[0]);
        using var data = Json(call.Arguments[1]);
        var loop = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == BodeFigure.LoopName);
        var x = loop.GetProperty("x").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        var y = loop.GetProperty("y").EnumerateArray().Select(v => v.GetDouble()).ToArray();

        // The magnitude trace is the core's loop response: every point sent is a point of the core's grid (simplified to
        // at most BodeFigure.MaxPoints, rounded for display to 6 digits in Hz and 0.001 dB), ends and extremes kept, and
        // the drawn segments pass within BodeFigure.MagnitudeToleranceDb of every computed point.
        var r = analysis.LoopResponse!;
        Assert.InRange(x.Length, 10, BodeFigure.MaxPoints + 2);
        Assert.True(x.Length < r.FrequencyHz.Length / 2, $"{x.Length} of {r.FrequencyHz.Length} points sent: the smooth loop response was not simplified");
        AssertOnCurve(r.FrequencyHz, r.MagnitudeDb, x, y, 1e-3);
        AssertCovers(r.FrequencyHz, r.MagnitudeDb, x, y, BodeFigure.MagnitudeToleranceDb + 1e-3, logX: true);
        Assert.Equal(r.FrequencyHz[0], x[0], 1e-6 * r.FrequencyHz[0]);
        Assert.Equal(r.FrequencyHz[^1], x[^1], 1e-6 * r.FrequencyHz[^1]);
        Assert.Equal(r.MagnitudeDb.Max(), y.Max(), 1e-3);
        Assert.Equal(r.MagnitudeDb.Min(), y.Min(), 1e-3);
        Assert.Equal("y", loop.GetProperty("yaxis").GetString());

        var phase = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == BodeFigure.LoopName + " phase");
        Assert.Equal("y2", phase.GetProperty("yaxis").GetString());
        double[] px = [.. phase.GetProperty("x").EnumerateArray().Select(v => v.GetDouble())];
        double[] py = [.. phase.GetProperty("y").EnumerateArray().Select(v => v.GetDouble())];
        AssertOnCurve(r.FrequencyHz, r.PhaseDeg, px, py, 1e-3);
        AssertCovers(r.FrequencyHz, r.PhaseDeg, px, py, BodeFigure.PhaseToleranceDeg + 1e-3, logX: true);

        using var layout = Json(call.Arguments[2]);
        var text = layout.RootElement.GetRawText();
        Assert.Contains("\"type\":\"log\"", text, StringComparison.Ordinal);
        Assert.Contains("frequency (Hz)", text, StringComparison.Ordinal);
        Assert.Contains("magnitude (dB)", text, StringComparison.Ordinal);
        Assert.Contains("phase (deg)", text, StringComparison.Ordinal);

        // The phase margin label (text of the phase panel's labels trace) carries the core's figure; no shapes or annotations are sent.
        string pm = analysis.Margins!.PhaseMarginDeg!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture);
        var phaseMarks = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == ChartMarks.LabelsName(BodeFigure.PhaseMarksName));
        Assert.Contains(phaseMarks.GetProperty("text").EnumerateArray(), t => t.GetString()!.Contains("PM " + pm, StringComparison.Ordinal));
        Assert.False(layout.RootElement.TryGetProperty("shapes", out var shapes) && shapes.ValueKind == JsonValueKind.Array && shapes.GetArrayLength() > 0);
        Assert.False(layout.RootElement.TryGetProperty("annotations", out var notes) && notes.ValueKind == JsonValueKind.Array && notes.GetArrayLength() > 0);
    }

    [Fact]
    public void Bode_chart_marks_the_compensator_poles_and_zeros_where_the_core_placed_them()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Form, DesignForm.FromDesign(analysis.Design)));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        using var data = Json(module.Invocations["newPlot"].Single().Arguments[1]);
        // They are points of the magnitude panel's markers trace, told apart by their hover text.
        var marks = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == BodeFigure.MagnitudeMarksName);
        var x = marks.GetProperty("x").EnumerateArray().ToList();
        var hover = marks.GetProperty("hovertext").EnumerateArray().Select(v => v.GetString()).ToList();
        double[] At(string what) => [.. Enumerable.Range(0, x.Count).Where(i => hover[i] == what).Select(i => x[i].GetDouble())];
        var placement = analysis.ResolvedPlacement!;
        Assert.Equal(new[] { placement.Zero1Hz!.Value, placement.Zero2Hz!.Value }, At("compensator zero"));
        Assert.Equal(new[] { placement.Pole1Hz!.Value, placement.Pole2Hz!.Value }, At("compensator pole"));
    }

    [Fact]
    public void A_new_analysis_is_drawn_with_react_and_carries_the_new_numbers()
    {
        var module = PlotlyModule.Setup(this);
        var first = TestDesigns.DemoAnalysis;
        var form = DesignForm.FromDesign(first.Design);
        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, first).Add(c => c.Form, form));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        form.Inductance.SetText("2.2u");
        var second = DesignAnalyzer.Analyze(form.Build());
        cut.Render(p => p.Add(c => c.Analysis, second));

        Eventually.True(() => PlotlyModule.Calls(module).Count(i => i.Identifier == "react") == 1, "the redraw with Plotly.react");
        using var data = Json(module.Invocations["react"].Single().Arguments[1]);
        var loop = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == BodeFigure.LoopName);
        double[] x = [.. loop.GetProperty("x").EnumerateArray().Select(v => v.GetDouble())];
        double[] y = [.. loop.GetProperty("y").EnumerateArray().Select(v => v.GetDouble())];
        AssertOnCurve(second.LoopResponse!.FrequencyHz, second.LoopResponse.MagnitudeDb, x, y, 1e-3);
        Assert.Throws<Xunit.Sdk.EqualException>(() => AssertOnCurve(first.LoopResponse!.FrequencyHz, first.LoopResponse.MagnitudeDb, x, y, 1e-3));
    }

    [Fact]
    public void Step_chart_sends_both_responses_with_peak_and_settling_annotated()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<StepChart>(p => p.Add(c => c.Analysis, analysis));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        var call = module.Invocations["newPlot"].Single();
        Assert.Equal("step-chart", call.Arguments[0]);
        using var data = Json(call.Arguments[1]);
        var names = data.RootElement.EnumerateArray().Select(t => t.GetProperty("name").GetString()!).ToList();
        var load = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString()!.StartsWith(StepFigure.LoadName, StringComparison.Ordinal));
        var step = analysis.LoadStep!;
        double[] ly = [.. load.GetProperty("y").EnumerateArray().Select(v => v.GetDouble())];
        double quantum = 1e-5 * step.Value.Max(Math.Abs);
        double[] lx = [.. load.GetProperty("x").EnumerateArray().Select(v => v.GetDouble())];
        AssertOnCurve(step.TimeS, step.Value, lx, ly, quantum);
        AssertCovers(step.TimeS, step.Value, lx, ly, ChartNumbers.TimeTolerance(step.Value) + quantum, logX: false);
        Assert.InRange(ly.Length, 10, StepFigure.MaxPoints + 2);
        Assert.Equal(step.Metrics.PeakDeviation, ly.Min(), quantum); // the undershoot peak survives thinning
        Assert.Contains(names, n => n.StartsWith(StepFigure.ReferenceName, StringComparison.Ordinal));

        using var layout = Json(call.Arguments[2]);
        var text = layout.RootElement.GetRawText();
        Assert.Contains("time (s)", text, StringComparison.Ordinal);
        foreach (var axis in new[] { "yaxis", "yaxis2" })
        {
            // volts with SI prefixes down to 10^0: ticks read -25m, not -0.025
            var y = layout.RootElement.GetProperty(axis);
            Assert.Equal("SI", y.GetProperty("exponentformat").GetString());
            Assert.Equal(0, y.GetProperty("minexponent").GetDouble());
            Assert.EndsWith("(V)", y.GetProperty("title").GetProperty("text").GetString(), StringComparison.Ordinal);
        }

        var labels = data.RootElement.EnumerateArray().Where(t => t.TryGetProperty("text", out var v) && v.ValueKind == JsonValueKind.Array)
            .SelectMany(t => t.GetProperty("text").EnumerateArray().Select(v => v.GetString())).ToList();
        Assert.Contains("overshoot " + analysis.ReferenceStep!.Metrics.OvershootPct!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + " %", labels);
        Assert.Equal(2, labels.Count(l => l!.StartsWith("settled (2 %) ", StringComparison.Ordinal)));
    }

    [Fact]
    public void Non_finite_numbers_never_reach_the_chart()
    {
        // A response with a NaN and an infinity in it: those points become gaps (null), never numbers.
        var r = TestDesigns.DemoAnalysis.LoopResponse!;
        var broken = r with { MagnitudeDb = r.MagnitudeDb.SetItem(3, double.NaN).SetItem(7, double.PositiveInfinity) };
        var analysis = TestDesigns.DemoAnalysis with { LoopResponse = broken };
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);

        string json = JsonSerializer.Serialize(figure.Data.Cast<object>().ToList());
        Assert.DoesNotContain("NaN", json, StringComparison.Ordinal);
        Assert.DoesNotContain("Infinity", json, StringComparison.Ordinal);
        var loop = (Plotly.Blazor.Traces.Scatter)figure.Data.First();
        Assert.All(loop.Y.OfType<double>(), v => Assert.True(double.IsFinite(v)));
        var sentX = loop.X.OfType<double>().ToHashSet();
        Assert.DoesNotContain(ChartNumbers.Significant(r.FrequencyHz[3], 6), sentX);
        Assert.DoesNotContain(ChartNumbers.Significant(r.FrequencyHz[7], 6), sentX);

        // Unthinned series turn such points into gaps.
        var (_, ys) = ChartNumbers.Series(broken.FrequencyHz, broken.MagnitudeDb, 1e-3);
        Assert.Null(ys[3]);
        Assert.Null(ys[7]);
        Assert.Equal(Math.Round(r.MagnitudeDb[4], 3), ys[4]);
    }

    [Fact]
    public async Task Disposing_the_chart_releases_its_javascript_side()
    {
        var module = PlotlyModule.Setup(this);
        var cut = Render<StepChart>(p => p.Add(c => c.Analysis, TestDesigns.DemoAnalysis));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        await DisposeComponentsAsync();
        Assert.Single(module.Invocations["purge"]);
    }

    /// <summary>Every sent point (x, y) lies on the core's curve: x is one of its grid points (to 6 digits), y its value there within <paramref name="tolerance"/>.</summary>
    private static void AssertOnCurve(System.Collections.Immutable.ImmutableArray<double> coreX, System.Collections.Immutable.ImmutableArray<double> coreY, double[] x, double[] y, double tolerance)
    {
        Assert.Equal(x.Length, y.Length);
        for (int i = 0; i < x.Length; i++)
        {
            int k = 0;
            double best = double.PositiveInfinity;
            for (int j = 0; j < coreX.Length; j++)
            {
                double d = Math.Abs(coreX[j] - x[i]);
                if (d < best)
                {
                    best = d;
                    k = j;
                }
            }

            Assert.True(best <= 1e-5 * Math.Max(Math.Abs(x[i]), 1e-12), $"x = {x[i]} is not on the core's grid");
            Assert.Equal(coreY[k], y[i], tolerance);
        }
    }

    /// <summary>Every computed point lies within <paramref name="tolerance"/> of the drawn polyline (linear in log x when <paramref name="logX"/>).</summary>
    private static void AssertCovers(System.Collections.Immutable.ImmutableArray<double> coreX, System.Collections.Immutable.ImmutableArray<double> coreY, double[] x, double[] y, double tolerance, bool logX)
    {
        Func<double, double> u = logX ? Math.Log10 : v => v;
        int k = 0;
        for (int j = 0; j < coreX.Length; j++)
        {
            if (!double.IsFinite(coreY[j]))
            {
                continue;
            }

            while (k < x.Length - 2 && x[k + 1] < coreX[j] * (1 - 1e-7))
            {
                k++;
            }

            double t = (u(coreX[j]) - u(x[k])) / (u(x[k + 1]) - u(x[k]));
            double drawn = y[k] + (Math.Clamp(t, 0, 1) * (y[k + 1] - y[k]));
            Assert.True(Math.Abs(drawn - coreY[j]) <= tolerance * (1 + 1e-9), $"at x = {coreX[j]} the chart draws {drawn}, the core has {coreY[j]} (tolerance {tolerance})");
        }
    }

    private static JsonDocument Json(object? argument) => JsonDocument.Parse(JsonSerializer.Serialize(argument));
}
