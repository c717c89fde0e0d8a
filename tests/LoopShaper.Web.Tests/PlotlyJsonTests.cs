using System.Text.Json;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Web.Model.Charts;
using Plotly.Blazor;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The figures' JSON written with property lists kept per type is Plotly.Blazor's own, character for character, for
/// every chart of the workspace (Plotly.Blazor's PrepareJsInterop is the reference: it is what the chart sends).
/// </summary>
public sealed class PlotlyJsonTests
{
    public static TheoryData<string> Figures() => [.. AllFigures().Keys];

    [Theory]
    [MemberData(nameof(Figures))]
    public void Prepared_figures_send_exactly_what_plotly_blazor_would(string name)
    {
        var figure = AllFigures()[name];
        Assert.NotEmpty(figure.Data);
        foreach (var trace in figure.Data)
        {
            var prepared = PlotlyJson.Prepare(trace);
            Assert.IsType<PreparedTrace>(prepared);
            Assert.Equal(trace.Type, prepared.Type);
            Assert.Equal(Sent(trace), Sent(prepared));
        }

        Assert.Equal(Sent(figure.Layout), Sent(PlotlyJson.Prepare(figure.Layout)));
    }

    [Fact]
    public void The_chart_configuration_sent_with_a_group_redraw_is_what_plotly_blazor_would_send()
    {
        // ChartRedrawGroup sends the configuration with every redraw, as PlotlyChart.React does: the same JSON, or
        // plotly.js would see a changed configuration and replot the chart from scratch.
        var config = Web.Model.Charts.ChartConfig.Interactive;
        Assert.Equal(Sent(config), Sent(new PreparedConfig(PlotlyJson.Serialize(config))));
        Assert.Contains("\"displaylogo\":false", PlotlyJson.Serialize(config), StringComparison.Ordinal);
    }

    [Fact]
    public void Array_values_are_written_only_when_the_single_value_is_unset_and_subplot_lists_are_numbered()
    {
        // Plotly.Blazor's own rules (its PlotlyConverter): SizeArray only without Size; YAxis[1] becomes "yaxis2".
        var both = new Plotly.Blazor.Traces.Scatter { Marker = new Plotly.Blazor.Traces.ScatterLib.Marker { Size = 7, SizeArray = [3, 4] } };
        var array = new Plotly.Blazor.Traces.Scatter { Marker = new Plotly.Blazor.Traces.ScatterLib.Marker { SizeArray = [3, 4] } };
        Assert.Contains("\"size\":7", PlotlyJson.Serialize(both), StringComparison.Ordinal);
        Assert.Contains("\"size\":[3,4]", PlotlyJson.Serialize(array), StringComparison.Ordinal);
        Assert.Equal(Sent(both), Sent(PlotlyJson.Prepare(both)));
        Assert.Equal(Sent(array), Sent(PlotlyJson.Prepare(array)));
        Assert.Contains("\"yaxis2\":", PlotlyJson.Serialize(AllFigures()["bode"].Layout), StringComparison.Ordinal);
    }

    // What PlotlyChart.React sends for a trace or layout: Plotly.Blazor's internal PrepareJsInterop with its own options.
    private static readonly System.Reflection.MethodInfo PrepareJsInterop = typeof(Layout).Assembly.GetType("Plotly.Blazor.Extensions", throwOnError: true)!
        .GetMethod("PrepareJsInterop")!.MakeGenericMethod(typeof(object));

    private static readonly object? PlotlyOptions = typeof(PlotlyJsInterop)
        .GetField("SerializerOptions", System.Reflection.BindingFlags.NonPublic | System.Reflection.BindingFlags.Static)!.GetValue(null);

    private static string Sent(object value) => JsonSerializer.Serialize(PrepareJsInterop.Invoke(null, [value, PlotlyOptions]));

    private static Dictionary<string, ChartFigure> AllFigures()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var design = analysis.Design;
        var closed = ClosedLoopPoint.Analyze(design, ClosedLoopPoint.Main);
        var table = CornerSweep.Run(design);
        var mc = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 50));
        var other = DesignAnalyzer.Analyze(design with { Name = "other" });
        return new()
        {
            ["bode"] = BodeFigure.Build(analysis, new BodeTraces(), null),
            ["bode, gain selected, plant off"] = BodeFigure.Build(analysis, new BodeTraces(Plant: false), PlacementTarget.Zero1),
            ["steps"] = StepFigure.Build(analysis),
            ["closed loop"] = ClosedLoopFigure.Build(closed, design.Analysis.StartHz, design.Analysis.StopHz),
            ["transients"] = TransientFigure.Build(closed),
            ["corners"] = CornerBodeFigure.Build(table, design.Analysis.StartHz, design.Analysis.StopHz),
            ["histograms"] = HistogramFigure.Build(mc, design.Criteria, 500e3),
            ["compare bode"] = CompareFigure.Bode(analysis, "A", other, "B"),
            ["compare steps"] = CompareFigure.Steps(analysis, "A", other, "B"),
        };
    }
}
