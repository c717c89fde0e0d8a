using System.Text.Json;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Plotly.Blazor;
using Plotly.Blazor.Traces;

namespace LoopShaper.Web.Tests;

/// <summary>
/// Charts that follow the same analysis go to the browser in one message (one reactAll call of the redraw module), once
/// every member has its redraw of the round; an untagged redraw or a flush goes at once.
/// </summary>
public sealed class ChartRedrawGroupTests : BunitContext
{
    private readonly BunitJSModuleInterop _plotly;
    private readonly ChartRedrawGroup _group;

    public ChartRedrawGroupTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        _plotly = PlotlyModule.Setup(this);
        _group = new ChartRedrawGroup(new SerializedJsRuntime(JSInterop.JSRuntime), Microsoft.Extensions.Logging.Abstractions.NullLogger.Instance);
    }

    [Fact]
    public async Task A_round_waits_for_every_member_then_goes_in_one_call()
    {
        var (a, b) = RenderPair();
        var round = new object();

        await a.InvokeAsync(() => a.Instance.Show(Figure("a2"), round));
        await _group.Sending;
        Assert.Empty(ReactAlls());

        await b.InvokeAsync(() => b.Instance.Show(Figure("b2"), round));
        Eventually.True(() => ReactAlls().Count == 1, "the round's reactAll");
        Assert.Equal([("a", "a2"), ("b", "b2")], Sent(ReactAlls().Single()));
        Assert.DoesNotContain(PlotlyModule.Calls(_plotly), i => i.Identifier == "react"); // no chart went on its own
        Assert.False(a.Instance.IsStale);
        Assert.False(b.Instance.IsStale);
    }

    [Fact]
    public async Task A_redraw_without_a_round_goes_at_once_and_a_flush_sends_what_waits()
    {
        var (a, b) = RenderPair();

        await a.InvokeAsync(() => a.Instance.Show(Figure("a2")));
        Eventually.True(() => ReactAlls().Count == 1, "the untagged redraw");
        Assert.Equal([("a", "a2")], Sent(ReactAlls()[0]));
        await _group.Sending;

        // Half a round (the other chart's panel failed, say) waits until the page flushes after its render.
        await b.InvokeAsync(() => b.Instance.Show(Figure("b2"), new object()));
        await _group.Sending;
        Assert.Single(ReactAlls());
        _group.Flush();
        Eventually.True(() => ReactAlls().Count == 2, "the flushed redraw");
        Assert.Equal([("b", "b2")], Sent(ReactAlls()[1]));
    }

    [Fact]
    public async Task A_member_that_leaves_no_longer_holds_the_round()
    {
        var (a, b) = RenderPair();
        var round = new object();
        await a.InvokeAsync(() => a.Instance.Show(Figure("a2"), round));
        await _group.Sending;
        Assert.Empty(ReactAlls());

        await b.Instance.DisposeAsync();
        Eventually.True(() => ReactAlls().Count == 1, "the round without the disposed chart");
        Assert.Equal([("a", "a2")], Sent(ReactAlls().Single()));
        Assert.Equal(1, _group.MemberCount);
    }

    private (IRenderedComponent<LiveChart> A, IRenderedComponent<LiveChart> B) RenderPair()
    {
        var host = Render<CascadingValue<ChartRedrawGroup>>(p => p
            .Add(c => c.Value, _group)
            .Add(c => c.IsFixed, true)
            .Add(c => c.ChildContent, (RenderFragment)(builder =>
            {
                foreach (string id in new[] { "a", "b" })
                {
                    builder.OpenComponent<LiveChart>(0);
                    builder.AddAttribute(1, nameof(LiveChart.Id), id);
                    builder.AddAttribute(2, nameof(LiveChart.Figure), Figure(id + "1"));
                    builder.AddAttribute(3, nameof(LiveChart.DeferOffscreen), false);
                    builder.AddAttribute(4, nameof(LiveChart.JoinRedrawGroup), true);
                    builder.CloseComponent();
                }
            })));
        Eventually.True(() => _group.MemberCount == 2, "both charts drawn and in the group");
        var charts = host.FindComponents<LiveChart>();
        return (charts[0], charts[1]);
    }

    private List<JSRuntimeInvocation> ReactAlls() => [.. PlotlyModule.Calls(JSInterop).Where(i => i.Identifier == "reactAll")];

    private static ChartFigure Figure(string name)
        => new([new Scatter { Name = name, X = [1.0, 2.0, 3.0], Y = [0.5, 1.5, 1.0] }], new Layout(), []);

    /// <summary>(chart id, first trace's name) of each chart in a reactAll call.</summary>
    private static List<(string, string)> Sent(JSRuntimeInvocation call)
    {
        using var doc = JsonDocument.Parse(JsonSerializer.Serialize(call.Arguments[0]));
        return [.. doc.RootElement.EnumerateArray().Select(r => (r.GetProperty("Id").GetString()!, r.GetProperty("Data")[0].GetProperty("name").GetString()!))];
    }
}
