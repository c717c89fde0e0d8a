using System.Text.Json;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using Plotly.Blazor;
using Plotly.Blazor.Traces;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The chart that follows its figure: redraws go out with Plotly.react, a chart out of sight waits until it is in view,
/// and figures that arrive while one is being sent collapse into the newest.
/// </summary>
public sealed class LiveChartTests : BunitContext
{
    public LiveChartTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
    }

    [Fact]
    public async Task A_chart_out_of_sight_is_redrawn_when_it_comes_into_view_with_the_newest_figure_only()
    {
        var module = PlotlyModule.Setup(this);
        var cut = Render<LiveChart>(p => p.Add(c => c.Id, "c1").Add(c => c.Figure, Figure("first")));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        var watch = PlotlyModule.Calls(JSInterop).Single(i => i.Identifier == "watch");
        Assert.Equal("c1", watch.Arguments[0]);

        await cut.InvokeAsync(() => cut.Instance.OnVisibility(false));
        cut.Render(p => p.Add(c => c.Figure, Figure("second")));
        cut.Render(p => p.Add(c => c.Figure, Figure("third")));
        Assert.True(cut.Instance.IsStale);
        Assert.Empty(Reacts(module));

        await cut.InvokeAsync(() => cut.Instance.OnVisibility(true));
        Eventually.True(() => Reacts(module).Count == 1, "the first react");
        Assert.Equal(["third"], TraceNames(Reacts(module).Single()));
        Assert.False(cut.Instance.IsStale);
    }

    [Fact]
    public async Task A_chart_on_screen_is_redrawn_on_every_new_figure()
    {
        var module = PlotlyModule.Setup(this);
        var cut = Render<LiveChart>(p => p.Add(c => c.Id, "c2").Add(c => c.Figure, Figure("first")));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        Assert.Equal(["first"], TraceNames(module.Invocations["newPlot"].Single()));

        cut.Render(p => p.Add(c => c.Figure, Figure("second")));
        Eventually.True(() => Reacts(module).Count == 1, "the first react");
        await cut.Instance.Sending;
        cut.Render(p => p.Add(c => c.Figure, Figure("third")));
        Eventually.True(() => Reacts(module).Count == 2, "the second react");
        Assert.Equal(["third"], TraceNames(Reacts(module)[1]));

        // The same figure again is no redraw.
        var same = cut.Instance.Figure;
        cut.Render(p => p.Add(c => c.Figure, same));
        await cut.Instance.Sending;
        Assert.Equal(2, Reacts(module).Count);
    }

    [Fact]
    public async Task A_figure_shown_by_the_parent_is_sent_at_once_and_not_again_when_it_arrives_as_the_parameter()
    {
        var module = PlotlyModule.Setup(this);
        var cut = Render<LiveChart>(p => p.Add(c => c.Id, "c4").Add(c => c.Figure, Figure("first")).Add(c => c.DeferOffscreen, false));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        var second = Figure("second");
        await cut.InvokeAsync(() => cut.Instance.Show(second));
        Eventually.True(() => Reacts(module).Count == 1, "the react of the shown figure");
        Assert.Equal(["second"], TraceNames(Reacts(module)[0]));
        await cut.Instance.Sending;

        cut.Render(p => p.Add(c => c.Figure, second));
        await cut.Instance.Sending;
        Assert.Single(Reacts(module));
        Assert.False(cut.Instance.IsStale);
    }

    [Fact]
    public async Task Figures_that_arrive_while_one_is_being_sent_collapse_into_the_newest()
    {
        // Plotly.react that does not return until released: the first redraw is "in the browser" while more arrive.
        PlotlyModule.Serialize(this);
        var module = JSInterop.SetupModule(PlotlyModule.ModulePath);
        module.SetupVoid("importScript", "plotly-import", PlotlyModule.ScriptPath).SetVoidResult();
        module.SetupVoid("newPlot", _ => true).SetVoidResult();
        var react = module.SetupVoid("react", _ => true);
        var cut = Render<LiveChart>(p => p.Add(c => c.Id, "c3").Add(c => c.Figure, Figure("first")).Add(c => c.DeferOffscreen, false));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        cut.Render(p => p.Add(c => c.Figure, Figure("second")));
        Eventually.True(() => Reacts(module).Count == 1, "the first react");
        cut.Render(p => p.Add(c => c.Figure, Figure("third")));
        cut.Render(p => p.Add(c => c.Figure, Figure("fourth")));
        Assert.Single(Reacts(module));

        react.SetVoidResult();
        Eventually.True(() => Reacts(module).Count == 2, "the second react");
        await cut.Instance.Sending;
        Assert.Equal(["second"], TraceNames(Reacts(module)[0]));
        Assert.Equal(["fourth"], TraceNames(Reacts(module)[1]));

        // Always drawn: no visibility module was asked for.
        Assert.DoesNotContain(PlotlyModule.Calls(JSInterop), i => i.Identifier == "import" && Equals(i.Arguments[0], LiveChart.VisibilityModule));
    }

    [Fact]
    public void A_redraw_that_fails_is_logged_and_the_next_figure_still_goes_out()
    {
        // A send that throws something other than a disconnect (here from the JS runtime) once left the chart marked as
        // sending for good: no redraw ever went out again.
        var log = new RecordingLoggerProvider();
        Services.AddLogging(b => b.AddProvider(log));
        var module = PlotlyModule.Setup(this);
        module.SetupVoid("react", _ => true).SetException(new InvalidOperationException("broken react"));
        var cut = Render<LiveChart>(p => p.Add(c => c.Id, "c5").Add(c => c.Figure, Figure("first")).Add(c => c.DeferOffscreen, false));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));

        cut.Render(p => p.Add(c => c.Figure, Figure("second")));
        Eventually.True(() => { lock (log.Entries) { return log.Entries.Any(e => e.Level == LogLevel.Error && e.Message.Contains("c5", StringComparison.Ordinal)); } }, "the failure logged");

        module.SetupVoid("react", _ => true).SetVoidResult();
        cut.Render(p => p.Add(c => c.Figure, Figure("third")));
        Eventually.True(() => Reacts(module).Count == 2, "the next redraw");
        Assert.Equal(["third"], TraceNames(Reacts(module)[1]));
    }

    private static List<JSRuntimeInvocation> Reacts(BunitJSModuleInterop module)
        => [.. PlotlyModule.Calls(module).Where(i => i.Identifier == "react")];

    private static ChartFigure Figure(string name)
        => new([new Scatter { Name = name, X = [1.0, 2.0, 3.0], Y = [0.5, 1.5, 1.0] }], new Layout(), []);

    private static string[] TraceNames(JSRuntimeInvocation call)
    {
        using var data = JsonDocument.Parse(JsonSerializer.Serialize(call.Arguments[1]));
        return [.. data.RootElement.EnumerateArray().Select(t => t.GetProperty("name").GetString()!)];
    }
}
