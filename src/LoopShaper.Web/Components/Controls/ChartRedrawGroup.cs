using LoopShaper.Web.Model.Charts;
using Microsoft.JSInterop;
using Plotly.Blazor;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Charts that follow the same analysis (the loop-gain and step charts), redrawn by one message to the browser. Sent
/// one by one, each chart's Plotly.react ran in its own browser task, and the browser laid out and painted the page
/// between them (12-22 ms per change in the browser benchmark's timeline); sent together they run in one task and the
/// page is painted once. A redraw tagged with a round (the analysis it shows) waits until every member has one for the
/// same round; an untagged one (a trace switched off, a marker selected) goes at once, and <see cref="Flush"/> sends
/// whatever waits (the page calls it after every render, so a member that failed to draw never holds the others).
/// One send at a time: redraws that arrive meanwhile replace older ones of the same chart.
/// </summary>
public sealed class ChartRedrawGroup : IAsyncDisposable
{
    /// <summary>Path of the redraw module, relative to the app's base.</summary>
    public const string ModulePath = "./js/chart-redraw.js";

    private readonly IJSRuntime _js;
    private readonly ILogger _logger;
    private readonly object _gate = new();
    private readonly List<LiveChart> _members = [];
    private readonly Dictionary<LiveChart, Pending> _pending = [];
    private Task<IJSObjectReference>? _module;
    private bool _ready;
    private bool _sending;
    private bool _disposed;

    /// <summary>A group that sends through <paramref name="js"/> and logs a failed send to <paramref name="logger"/>.</summary>
    public ChartRedrawGroup(IJSRuntime js, ILogger logger)
    {
        _js = js;
        _logger = logger;
    }

    /// <summary>Charts taking part (drawn and not disposed).</summary>
    internal int MemberCount
    {
        get
        {
            lock (_gate)
            {
                return _members.Count;
            }
        }
    }

    /// <summary>The latest send (completes when the browser has it).</summary>
    public Task Sending { get; private set; } = Task.CompletedTask;

    /// <summary>One chart's redraw as the browser module takes it.</summary>
    /// <param name="Id">Element id of the chart.</param>
    /// <param name="Data">The traces, JSON written (<see cref="PreparedTrace"/>).</param>
    /// <param name="Layout">The layout, JSON written (<see cref="PreparedLayout"/>).</param>
    /// <param name="Config">The chart's configuration, JSON written.</param>
    public sealed record Redraw(string Id, object[] Data, object Layout, object Config);

    private sealed record Pending(object? Round, Task<(List<ITrace> Data, Plotly.Blazor.Layout Layout)> Prepared);

    /// <summary>Sends every waiting redraw now.</summary>
    public void Flush()
    {
        lock (_gate)
        {
            _ready |= _pending.Count > 0;
        }

        StartSending();
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        lock (_gate)
        {
            _disposed = true;
            _pending.Clear();
        }

        if (_module is { IsCompletedSuccessfully: true } m)
        {
            try
            {
                await m.Result.DisposeAsync();
            }
            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException or ObjectDisposedException)
            {
                // The circuit went away with the page.
            }
        }
    }

    /// <summary>A drawn chart takes part: rounds wait for its redraw from now on.</summary>
    internal void Join(LiveChart chart)
    {
        lock (_gate)
        {
            if (!_members.Contains(chart))
            {
                _members.Add(chart);
            }
        }
    }

    /// <summary>A chart leaves (disposed): rounds no longer wait for it.</summary>
    internal void Leave(LiveChart chart)
    {
        lock (_gate)
        {
            _members.Remove(chart);
            _pending.Remove(chart);
            _ready |= _pending.Count > 0 && IsComplete();
        }

        StartSending();
    }

    /// <summary>
    /// Queues <paramref name="figure"/> for <paramref name="chart"/>, its JSON written now on the thread pool; sends the
    /// queue when the round is complete, or at once for a null round.
    /// </summary>
    internal void Submit(LiveChart chart, ChartFigure figure, object? round)
    {
        var prepared = Task.Run(() => (figure.Data.Select(PlotlyJson.Prepare).ToList(), PlotlyJson.Prepare(figure.Layout)));
        lock (_gate)
        {
            if (_disposed)
            {
                return;
            }

            _pending[chart] = new Pending(round, prepared);
            _ready |= round is null || IsComplete();
        }

        StartSending();
    }

    // Every member has a redraw waiting, all of the same round. Called under the lock.
    private bool IsComplete()
    {
        object? round = null;
        foreach (var m in _members)
        {
            if (!_pending.TryGetValue(m, out var p) || p.Round is null || (round is not null && !ReferenceEquals(p.Round, round)))
            {
                return false;
            }

            round = p.Round;
        }

        return true;
    }

    private void StartSending()
    {
        lock (_gate)
        {
            if (!_ready || _sending || _disposed)
            {
                return;
            }

            _sending = true;
        }

        Sending = Task.Run(SendReady);
    }

    private async Task SendReady()
    {
        while (true)
        {
            List<KeyValuePair<LiveChart, Pending>> batch;
            lock (_gate)
            {
                if (!_ready || _pending.Count == 0 || _disposed)
                {
                    _ready = false;
                    _sending = false;
                    return;
                }

                batch = [.. _pending];
                _pending.Clear();
                _ready = false;
            }

            try
            {
                var redraws = new List<Redraw>(batch.Count);
                foreach (var (chart, pending) in batch)
                {
                    var (data, layout) = await pending.Prepared.ConfigureAwait(false);
                    redraws.Add(chart.Redrawn(data, layout));
                }

                _module ??= _js.InvokeAsync<IJSObjectReference>("import", ModulePath).AsTask();
                var module = await _module.ConfigureAwait(false);
                await module.InvokeVoidAsync("reactAll", redraws).ConfigureAwait(false);
            }
            catch (Exception ex) when (ex is JSDisconnectedException or JSException or TaskCanceledException or ObjectDisposedException)
            {
                // The circuit or a chart went away; nothing to draw into. A failed import is tried again next time.
                if (_module is { IsFaulted: true } or { IsCanceled: true })
                {
                    _module = null;
                }
            }
            catch (Exception ex)
            {
                // Logged, and the group goes on with the next redraws: a faulted send must not leave it marked as sending.
                _logger.LogError(ex, "Redraw of charts {Ids} failed", string.Join(", ", batch.Select(b => b.Key.Id)));
            }
        }
    }
}
