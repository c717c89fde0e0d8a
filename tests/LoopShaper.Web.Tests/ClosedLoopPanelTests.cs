using System.Numerics;
using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;

namespace LoopShaper.Web.Tests;

/// <summary>The closed-loop performance panel: what it sends to Plotly, and the corner selector.</summary>
public sealed class ClosedLoopPanelTests : BunitContext
{
    public ClosedLoopPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
    }

    [Fact]
    public void Closed_loop_output_impedance_is_the_open_one_divided_by_one_plus_t()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<ClosedLoopPanel>(p => p.Add(c => c.Analysis, analysis));
        var call = Drawn(cut, module, "closed-loop-chart");
        using var data = Json(call.Arguments[1]);
        var open = Trace(data, ClosedLoopFigure.ImpedanceOpenName);
        var closed = Trace(data, ClosedLoopFigure.ImpedanceClosedName);
        Assert.Equal("y", closed.GetProperty("yaxis").GetString());
        Assert.Equal("y2", Trace(data, ClosedLoopFigure.LineClosedName).GetProperty("yaxis").GetString());

        // Erickson and Maksimovic, 2nd ed., sec. 9.2: Zout,cl = Zout / (1 + T). Checked point by point against the
        // core's open-loop Zout and T evaluated directly (not through the closed-loop function the panel used);
        // 0.01 dB covers the display rounding (0.001 dB) and the Pade approximation of a loop delay.
        var loop = analysis.Loop!;
        double[] fx = Doubles(closed, "x"), zcl = Doubles(closed, "y");
        Assert.InRange(fx.Length, 10, ClosedLoopFigure.MaxPoints + 2);
        for (int i = 0; i < fx.Length; i += 7)
        {
            Complex t = loop.LoopGain.EvaluateHz(fx[i]);
            double expected = loop.OutputImpedance!.MagnitudeDb(fx[i]) - (20 * Math.Log10(Complex.Abs(1 + t)));
            Assert.Equal(expected, zcl[i], 1e-2);
        }

        // The open-loop trace is the power stage's Zout, unchanged by the loop.
        double[] ox = Doubles(open, "x"), zo = Doubles(open, "y");
        for (int i = 0; i < ox.Length; i += 11)
        {
            Assert.Equal(loop.OutputImpedance!.MagnitudeDb(ox[i]), zo[i], 1e-2);
        }

        // Below crossover |T| >> 1: the loop lowers the impedance (the closed curve lies below the open one there).
        Assert.True(zcl[0] < zo[0] - 20, $"closed {zcl[0]} dBOhm vs open {zo[0]} dBOhm at {fx[0]} Hz");

        using var layout = Json(call.Arguments[2]);
        var strings = Strings(layout.RootElement).ToList();
        Assert.Contains("output impedance (dBΩ)", strings);
        Assert.Contains("line to output (dB)", strings);
        Assert.Equal(2, strings.Count(s => s == "frequency (Hz)"));
        Assert.Equal(2, strings.Count(s => s == "log"));
    }

    [Fact]
    public void Closed_loop_audio_susceptibility_is_the_open_one_divided_by_one_plus_t()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<ClosedLoopPanel>(p => p.Add(c => c.Analysis, analysis));
        using var data = Json(Drawn(cut, module, "closed-loop-chart").Arguments[1]);
        var closed = Trace(data, ClosedLoopFigure.LineClosedName);
        double[] fx = Doubles(closed, "x"), g = Doubles(closed, "y");
        var loop = analysis.Loop!;

        // Erickson and Maksimovic, 2nd ed., sec. 9.2: Gvg,cl = Gvg / (1 + T).
        for (int i = 0; i < fx.Length; i += 7)
        {
            Complex t = loop.LoopGain.EvaluateHz(fx[i]);
            Assert.Equal(loop.LineToOutput!.MagnitudeDb(fx[i]) - (20 * Math.Log10(Complex.Abs(1 + t))), g[i], 1e-2);
        }
    }

    [Fact]
    public async Task Changes_arriving_while_the_engineer_types_are_analysed_once_after_the_design_settles()
    {
        // Two new analyses in quick succession (as while typing or dragging): the panel waits SettleMs after the last
        // one, so it leaves the cores to the main charts and then analyses the latest design only.
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<ClosedLoopPanel>(p => p.Add(c => c.Analysis, analysis).Add(c => c.SettleMs, 1500));
        Drawn(cut, module, "closed-loop-chart");
        await cut.Instance.Computed;
        int before = Sent(module, "closed-loop-chart").Count;
        var first = cut.Instance.Performance;

        var second = analysis with { };
        var latest = analysis with { };
        cut.Render(p => p.Add(c => c.Analysis, second));
        cut.Render(p => p.Add(c => c.Analysis, latest));
        Assert.Same(first, cut.Instance.Performance); // nothing recomputed yet: the design is still settling

        await cut.Instance.Computed;
        Eventually.True(() => Sent(module, "closed-loop-chart").Count > before, "the redraw after the design settled");
        Assert.NotSame(first, cut.Instance.Performance);
        Assert.Equal(before + 1, Sent(module, "closed-loop-chart").Count);
    }

    [Fact]
    public void Choosing_a_corner_redraws_with_that_corners_loop()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<ClosedLoopPanel>(p => p.Add(c => c.Analysis, analysis));
        Drawn(cut, module, "closed-loop-chart");
        int before = Sent(module, "closed-loop-chart").Count;
        var corner = ClosedLoopPoint.Corners.First(c => c.Input == InputCorner.Max && c.Load == LoadCorner.Min && c.Tolerances == LoopShaper.Core.Corners.ToleranceSet.Nominal);

        cut.Find("[data-closed-loop-corner]").Change(ClosedLoopPoint.Key(corner));

        Eventually.True(() => Sent(module, "closed-loop-chart").Count > before, "a redraw for the corner");
        Assert.Equal(ClosedLoopPoint.Key(corner), cut.Instance.Choice);
        using var data = Json(Sent(module, "closed-loop-chart")[^1].Arguments[1]);
        var closed = Trace(data, ClosedLoopFigure.LineClosedName);
        double[] fx = Doubles(closed, "x"), g = Doubles(closed, "y");

        // The corner's loop, built by the core at the corner's input voltage and load (nominal parts: every factor 1
        // for the demo, which has no DC-bias derating), the compensator unchanged.
        var fixedDesign = LoopShaper.Core.Corners.CornerSweep.Fixed(analysis.Design);
        var atCorner = DesignAnalyzer.BuildLoop(fixedDesign, LoopShaper.Core.Corners.CornerSweep.ConditionOf(fixedDesign, corner)).Loop;
        var main = analysis.Loop!;
        int k = fx.Length / 3;
        double expected = atCorner.LineToOutput!.MagnitudeDb(fx[k]) - (20 * Math.Log10(Complex.Abs(1 + atCorner.LoopGain.EvaluateHz(fx[k]))));
        double mainValue = main.LineToOutput!.MagnitudeDb(fx[k]) - (20 * Math.Log10(Complex.Abs(1 + main.LoopGain.EvaluateHz(fx[k]))));
        Assert.Equal(expected, g[k], 1e-2);
        Assert.True(Math.Abs(expected - mainValue) > 0.1, $"the corner ({expected} dB) should differ from the main point ({mainValue} dB)");
    }

    [Fact]
    public void The_transients_carry_the_cores_peak_and_recovery()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<ClosedLoopPanel>(p => p.Add(c => c.Analysis, analysis));
        var call = Drawn(cut, module, "transient-chart");
        var p = cut.Instance.Performance!;
        var load = p.LoadStep!;

        using var data = Json(call.Arguments[1]);
        var trace = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString()!.StartsWith(TransientFigure.LoadName, StringComparison.Ordinal));
        double[] y = Doubles(trace, "y");
        double quantum = 1e-5 * load.Response.Value.Max(Math.Abs);
        Assert.InRange(y.Length, 10, TransientFigure.MaxPoints + 2);
        Assert.Equal(load.Response.Value.Min(), y.Min(), quantum); // the undershoot survives thinning

        // A load step up draws current from the output: the deviation is negative (vout = -Zout,cl iload,
        // Erickson and Maksimovic sec. 9.2), and the core's recovery time is annotated.
        Assert.True(load.PeakDeviationV < 0, $"{load.PeakDeviationV} V");
        using var layout = Json(call.Arguments[2]);
        var strings = Strings(layout.RootElement).ToList();
        Assert.Contains(strings, s => s == "peak " + "\u2212" + LoopShaper.Core.Units.EngineeringFormat.Format(-load.PeakDeviationV, "V"));
        if (load.RecoveryTimeS is double rt)
        {
            Assert.Contains(strings, s => s.StartsWith("recovered " + LoopShaper.Core.Units.EngineeringFormat.Format(rt, "s"), StringComparison.Ordinal));
        }

        Assert.Equal(3, strings.Count(s => s == "time (s)"));
        Assert.NotNull(p.LineStep);
        Assert.Contains(data.RootElement.EnumerateArray(), t => t.GetProperty("name").GetString()!.StartsWith(TransientFigure.LineName, StringComparison.Ordinal));
        Assert.Contains(data.RootElement.EnumerateArray(), t => t.GetProperty("name").GetString()!.StartsWith(TransientFigure.ReferenceName, StringComparison.Ordinal));
    }

    [Fact]
    public void A_custom_plant_without_zout_says_so_and_sends_no_numbers_it_does_not_have()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = ClosedLoopFigure.Build(null, analysis.Design.Analysis.StartHz, analysis.Design.Analysis.StopHz);
        Assert.Empty(figure.Data);
        string text = JsonSerializer.Serialize(figure.Layout);
        Assert.Contains("no output impedance for this plant", text, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", text, StringComparison.Ordinal);
    }

    /// <summary>The latest draw (newPlot or react) of a chart once it carries traces.</summary>
    private static JSRuntimeInvocation Drawn(IRenderedComponent<ClosedLoopPanel> cut, BunitJSModuleInterop module, string id)
    {
        Eventually.True(() => Sent(module, id) is { Count: > 0 } sent && HasTraces(sent[^1]), id + " drawn with traces");
        return Sent(module, id)[^1];
    }

    private static bool HasTraces(JSRuntimeInvocation call)
    {
        using var d = Json(call.Arguments[1]);
        return d.RootElement.GetArrayLength() > 0;
    }

    private static List<JSRuntimeInvocation> Sent(BunitJSModuleInterop module, string id)
        => [.. PlotlyModule.Calls(module).Where(i => (i.Identifier == "newPlot" || i.Identifier == "react") && Equals(i.Arguments[0], id))];

    private static IEnumerable<string> Strings(JsonElement e) => e.ValueKind switch
    {
        JsonValueKind.String => [e.GetString()!],
        JsonValueKind.Object => e.EnumerateObject().SelectMany(p => Strings(p.Value)),
        JsonValueKind.Array => e.EnumerateArray().SelectMany(Strings),
        _ => [],
    };

    private static JsonElement Trace(JsonDocument data, string name)
        => data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == name);

    private static double[] Doubles(JsonElement trace, string axis)
        => [.. trace.GetProperty(axis).EnumerateArray().Select(v => v.GetDouble())];

    private static JsonDocument Json(object? argument) => JsonDocument.Parse(JsonSerializer.Serialize(argument));
}
