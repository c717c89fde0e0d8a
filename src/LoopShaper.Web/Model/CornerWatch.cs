using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;

namespace LoopShaper.Web.Model;

/// <summary>
/// The corner sweep of the open design, kept current in the background: every new valid analysis is swept (<see
/// cref="CornerSweep.Run"/>) once it has stayed the latest for <see cref="SettleMs"/>, so that typing and dragging
/// leave the cores to the loop-gain and step charts; a new analysis stops a sweep still running. The summary's corner
/// verdict and the Corners card read the same table, the one `analyze` judges on the command line.
/// </summary>
public sealed class CornerWatch : IDisposable
{
    private readonly object _gate = new();
    private readonly ILogger _logger;
    private DesignAnalysis? _latest;
    private DesignAnalysis? _sweeping;
    private bool _disposed;

    /// <summary>A watch whose sweeps log their failures to <paramref name="logger"/>.</summary>
    public CornerWatch(ILogger logger)
    {
        _logger = logger;
        Run = new BackgroundRun<CornerTable>(logger);
        Run.Changed += () => Changed?.Invoke();
    }

    /// <summary>Raised from a pool thread when a sweep starts, moves on or ends.</summary>
    public event Action? Changed;

    /// <summary>How long an analysis must stay the latest before it is swept, ms.</summary>
    public int SettleMs { get; init; } = DesignerDefaults.SettleMs;

    /// <summary>Threads a sweep may use; null takes half the cores (the server is shared by every open workspace).</summary>
    public int? Threads { get; init; }

    /// <summary>The sweep in progress or last finished.</summary>
    public BackgroundRun<CornerTable> Run { get; }

    /// <summary>The table of the last finished sweep, or null before the first one.</summary>
    public CornerTable? Table => Run.Result;

    /// <summary>The analysis whose design the current (or last) sweep is of.</summary>
    public DesignAnalysis? SweptFrom
    {
        get
        {
            lock (_gate)
            {
                return _sweeping;
            }
        }
    }

    /// <summary>True when <see cref="Table"/> is the finished sweep of <paramref name="analysis"/>.</summary>
    public bool IsCurrentFor(DesignAnalysis? analysis) => analysis is not null && ReferenceEquals(SweptFrom, analysis) && Run.State == RunState.Finished;

    /// <summary>Follows the workspace's latest analysis; an invalid one (input errors) is not swept and leaves the last table.</summary>
    public Task Follow(DesignAnalysis? analysis)
    {
        lock (_gate)
        {
            if (_disposed || analysis is not { IsValid: true } || ReferenceEquals(analysis, _latest))
            {
                return Task.CompletedTask;
            }

            _latest = analysis;
        }

        // A sweep of an older design is of no use any more, and its core is wanted by the change being drawn; the last
        // finished table stays shown until the sweep of this analysis, once it has settled, replaces it.
        if (Run.IsRunning)
        {
            Run.Cancel();
        }

        return SweepWhenSettled(analysis);
    }

    /// <inheritdoc />
    public void Dispose()
    {
        lock (_gate)
        {
            _disposed = true;
        }

        Run.Dispose();
    }

    private async Task SweepWhenSettled(DesignAnalysis analysis)
    {
        if (SettleMs > 0)
        {
            await Task.Delay(SettleMs).ConfigureAwait(false);
        }

        lock (_gate)
        {
            if (_disposed || !ReferenceEquals(analysis, _latest))
            {
                return; // a newer analysis arrived while this one settled: that one is swept instead
            }

            _sweeping = analysis;
        }

        var design = analysis.Design;
        if (_logger.IsEnabled(LogLevel.Debug))
        {
            _logger.LogDebug("Sweeping the corners of '{Name}'", design.Name);
        }

        var options = new CornerSweepOptions(MaxDegreeOfParallelism: Threads ?? Math.Max(1, Environment.ProcessorCount / 2));
        await Run.Start((progress, token) => CornerSweep.Run(design, options, token)).ConfigureAwait(false);
    }
}
