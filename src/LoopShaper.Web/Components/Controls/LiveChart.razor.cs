using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Microsoft.JSInterop;
using Plotly.Blazor;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// A Plotly chart that follows its figure: drawn by the chart's own newPlot first, then redrawn with Plotly.react
/// whenever a new figure arrives. With <see cref="DeferOffscreen"/>, a chart out of sight is not redrawn (nor its figure
/// sent) until it scrolls into view: the workspace's secondary cards then cost nothing while the engineer tunes the loop.
/// With <see cref="JoinRedrawGroup"/>, the chart is redrawn together with the other charts of the page's
/// <see cref="ChartRedrawGroup"/> (one message, one browser task, one paint).
/// </summary>
public sealed partial class LiveChart : IAsyncDisposable
{
    /// <summary>Path of the visibility module, relative to the app's base.</summary>
    public const string VisibilityModule = "./js/chart-visibility.js";

    private readonly Plotly.Blazor.Config _config = ChartConfig.Interactive;
    private PlotlyChart? _chart;
    private ChartFigure? _firstFigure;
    private ChartFigure? _shown;
    private ChartFigure? _wanted;
    private ChartFigure? _lastParameter;
    private object? _wantedRound;
    private PreparedConfig? _preparedConfig;
    private Task _ownSending = Task.CompletedTask;
    private IJSObjectReference? _module;
    private DotNetObjectReference<LiveChart>? _self;
    private bool _drawn;
    private bool _visible = true;
    private bool _disposed;
    private readonly object _gate = new();
    private ChartFigure? _queued;
    private bool _sending;

    /// <summary>Element id of the chart.</summary>
    [Parameter, EditorRequired]
    public string Id { get; set; } = default!;

    /// <summary>The figure to show.</summary>
    [Parameter, EditorRequired]
    public ChartFigure Figure { get; set; } = default!;

    /// <summary>CSS class of the chart's element (its size).</summary>
    [Parameter]
    public string? CssClass { get; set; }

    /// <summary>Called with the points of a click on the chart, or null for a chart that takes no clicks.</summary>
    [Parameter]
    public Action<IEnumerable<Plotly.Blazor.Interop.EventDataPoint>>? ClickAction { get; set; }

    /// <summary>Leave the chart as it is while it is out of sight; redraw it when it comes into view.</summary>
    [Parameter]
    public bool DeferOffscreen { get; set; } = true;

    /// <summary>Redraw with the page's <see cref="ChartRedrawGroup"/> (when there is one); for charts always in view (no <see cref="DeferOffscreen"/>).</summary>
    [Parameter]
    public bool JoinRedrawGroup { get; set; }

    /// <summary>The page's redraw group, if any.</summary>
    [CascadingParameter]
    public ChartRedrawGroup? RedrawGroup { get; set; }

    /// <summary>True when the browser shows an older figure than the newest one given.</summary>
    public bool IsStale => !ReferenceEquals(_shown, _wanted ?? Figure);

    /// <summary>The send of the newest figure (completes when the browser has it); the group's latest send for a grouped chart.</summary>
    public Task Sending => Group?.Sending ?? _ownSending;

    private ChartRedrawGroup? Group => JoinRedrawGroup && !DeferOffscreen ? RedrawGroup : null;

    [Inject]
    private IJSRuntime Js { get; set; } = default!;

    [Inject]
    private ILogger<LiveChart> Logger { get; set; } = default!;

    /// <summary>Called by the visibility module when the chart comes into or goes out of view.</summary>
    [JSInvokable]
    public Task OnVisibility(bool visible)
    {
        _visible = visible;
        return visible ? InvokeAsync(RedrawIfStale) : Task.CompletedTask;
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        _disposed = true;
        Group?.Leave(this);
        if (_module is not null)
        {
            try
            {
                await _module.InvokeVoidAsync("unwatch", Id);
                await _module.DisposeAsync();
            }
            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException or ObjectDisposedException)
            {
                // The circuit went away with the page; nothing left to unwatch.
            }
        }

        _self?.Dispose();
    }

    /// <summary>
    /// Sends <paramref name="figure"/> now, from the parent's own parameter step, instead of when this chart's turn in the
    /// render comes (the parent still passes the same figure as <see cref="Figure"/>). A grouped chart's redraw waits
    /// for the other members' redraws of the same <paramref name="round"/> (the analysis shown); null sends it at once.
    /// </summary>
    public void Show(ChartFigure figure, object? round = null)
    {
        _wanted = figure;
        _wantedRound = round;
        RedrawIfStale();
    }

    /// <summary>Takes the group's prepared figure as the chart's own (for Plotly.Blazor) and gives the browser's redraw of it.</summary>
    internal ChartRedrawGroup.Redraw Redrawn(List<ITrace> data, Plotly.Blazor.Layout layout)
    {
#pragma warning disable BL0005 // The chart's figure is set here, outside a render, so that it can be sent before the render ends.
        _chart!.Data = data;
        _chart.Layout = layout;
#pragma warning restore BL0005
        _preparedConfig ??= new PreparedConfig(PlotlyJson.Serialize(_config));
        return new ChartRedrawGroup.Redraw(Id, [.. data], layout, _preparedConfig);
    }

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        _firstFigure ??= Figure;
        if (!ReferenceEquals(Figure, _lastParameter))
        {
            _lastParameter = Figure;
            _wanted = Figure;
            _wantedRound = null;
        }

        RedrawIfStale();
    }

    /// <inheritdoc />
    protected override async Task OnAfterRenderAsync(bool firstRender)
    {
        if (firstRender && DeferOffscreen)
        {
            try
            {
                _module = await Js.InvokeAsync<IJSObjectReference>("import", VisibilityModule);
                _self = DotNetObjectReference.Create(this);
                await _module.InvokeVoidAsync("watch", Id, _self);
            }
            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException)
            {
                // Without the module the chart is simply always redrawn.
            }
        }
    }

    private async void OnFirstDraw()
    {
        _drawn = true;
        _shown = _firstFigure;
        _wantedRound = null; // a figure that came before the first draw goes now, without waiting for a round
        Group?.Join(this);
        RedrawIfStale();
        if (ClickAction is not null && _chart is not null)
        {
            try
            {
                await _chart.SubscribeClickEvent();
            }
            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException)
            {
                // The circuit or the chart went away while it was being set up.
            }
        }
    }

    /// <summary>
    /// Sends the figure now, from the thread pool, so that its serialization and trip run beside the rest of the page's
    /// render instead of after the browser has applied it. One send per chart at a time; figures that arrive meanwhile
    /// collapse into the newest, so a fast drag never queues stale frames in the browser.
    /// </summary>
    private void RedrawIfStale()
    {
        if (_disposed || !_drawn || _chart is null || !IsStale || (DeferOffscreen && !_visible))
        {
            return;
        }

        var target = _wanted ?? Figure;
        _shown = target;
        if (Group is ChartRedrawGroup group)
        {
            group.Submit(this, target, _wantedRound);
            return;
        }

        lock (_gate)
        {
            _queued = target;
            if (_sending)
            {
                return;
            }

            _sending = true;
        }

        _ownSending = Task.Run(SendQueued);
    }

    private async Task SendQueued()
    {
        var chart = _chart!;
        while (true)
        {
            ChartFigure? figure;
            lock (_gate)
            {
                figure = _queued;
                _queued = null;
                if (figure is null || _disposed)
                {
                    _sending = false;
                    return;
                }
            }

            try
            {
                // Written here, beside the render, with the property lists kept per type (PlotlyJson): the same JSON
                // Plotly.Blazor would write, without its reflection on every property of every redraw.
                var data = figure.Data.Select(PlotlyJson.Prepare).ToList();
                var layout = PlotlyJson.Prepare(figure.Layout);
#pragma warning disable BL0005 // The chart's figure is set here, outside a render, so that it can be sent before the render ends.
                chart.Data = data;
                chart.Layout = layout;
#pragma warning restore BL0005
                await chart.React();
            }

            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException or ObjectDisposedException)
            {
                // The circuit or the chart went away; nothing to draw into.
            }
            catch (Exception ex)
            {
                // Anything else is logged and the chart goes on with the next figure (a faulted send must not leave it
                // marked as sending, which would stop its redraws for good).
                Logger.LogError(ex, "Redraw of chart {Id} failed", Id);
            }
        }
    }
}
