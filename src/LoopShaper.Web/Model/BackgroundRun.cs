using System.Diagnostics;

namespace LoopShaper.Web.Model;

/// <summary>
/// A long computation of the core on the thread pool, with progress and cancellation: the core reports progress
/// through <see cref="IProgress{T}"/> (fraction done, 0 to 1) and stops at its next check of the token. Progress
/// notifications are throttled (at most one per <see cref="ProgressInterval"/>) so that a fast run does not flood the
/// circuit; state changes are always notified. Disposing cancels a run still going.
/// </summary>
/// <typeparam name="TResult">What the run produces.</typeparam>
public sealed class BackgroundRun<TResult> : IDisposable
    where TResult : class
{
    /// <summary>Shortest time between two progress notifications.</summary>
    public static readonly TimeSpan ProgressInterval = TimeSpan.FromMilliseconds(100);

    private readonly ILogger _logger;
    private readonly object _gate = new();
    private CancellationTokenSource? _cts;
    private long _lastNotified;
    private int _generation;

    /// <summary>A run that logs its failures to <paramref name="logger"/>.</summary>
    public BackgroundRun(ILogger logger) => _logger = logger;

    /// <summary>Raised from a pool thread when the state changes or, throttled, when progress moves on.</summary>
    public event Action? Changed;

    /// <summary>Where the run is.</summary>
    public RunState State { get; private set; }

    /// <summary>Fraction done, 0 to 1.</summary>
    public double Progress { get; private set; }

    /// <summary>The result of the last run that returned one (a cancelled run may return a partial one); kept while a new one runs.</summary>
    public TResult? Result { get; private set; }

    /// <summary>Why the last run failed, or null.</summary>
    public string? Error { get; private set; }

    /// <summary>How long the last run took from start to its end (finished, cancelled or failed).</summary>
    public TimeSpan? Elapsed { get; private set; }

    /// <summary>Time from the cancel request to the end of the run, for the last cancelled run.</summary>
    public TimeSpan? StopLatency { get; private set; }

    /// <summary>The task of the current (or last) run; completes when it ends, never faults.</summary>
    public Task Completion { get; private set; } = Task.CompletedTask;

    /// <summary>True while a run is going.</summary>
    public bool IsRunning => State == RunState.Running;

    /// <summary>Starts <paramref name="work"/> on the thread pool, cancelling a run still going.</summary>
    public Task Start(Func<IProgress<double>, CancellationToken, TResult> work)
    {
        ArgumentNullException.ThrowIfNull(work);
        CancellationTokenSource cts;
        int generation;
        lock (_gate)
        {
            SafeCancel(_cts);
            _cts = cts = new CancellationTokenSource();
            generation = ++_generation;
            State = RunState.Running;
            Progress = 0;
            Error = null;
            StopLatency = null;
        }

        Changed?.Invoke();
        long started = Stopwatch.GetTimestamp();
        long cancelAsked = 0;
        cts.Token.Register(() => Interlocked.CompareExchange(ref cancelAsked, Stopwatch.GetTimestamp(), 0));
        var progress = new ProgressSink(this, generation);
        Completion = Task.Run(() =>
        {
            try
            {
                var result = work(progress, cts.Token);
                Finish(generation, () =>
                {
                    if (cts.IsCancellationRequested)
                    {
                        // A computation that returns what it had when cancelled (a partial result) keeps it.
                        Result = result;
                        State = RunState.Cancelled;
                    }
                    else
                    {
                        Result = result;
                        Progress = 1;
                        State = RunState.Finished;
                    }
                });
            }
            catch (OperationCanceledException) when (cts.IsCancellationRequested)
            {
                Finish(generation, () => State = RunState.Cancelled);
            }
            catch (Exception ex)
            {
                _logger.LogError(ex, "Background run failed");
                Finish(generation, () =>
                {
                    State = RunState.Failed;
                    Error = ex.Message;
                });
            }
            finally
            {
                long asked = Interlocked.Read(ref cancelAsked);
                lock (_gate)
                {
                    if (generation == _generation)
                    {
                        Elapsed = Stopwatch.GetElapsedTime(started);
                        StopLatency = asked != 0 ? Stopwatch.GetElapsedTime(asked) : null;
                    }
                }

                cts.Dispose();
                if (generation == _generation)
                {
                    Changed?.Invoke();
                }
            }
        });
        return Completion;
    }

    /// <summary>Asks the running computation to stop; it ends at the core's next check of the token.</summary>
    public void Cancel()
    {
        lock (_gate)
        {
            SafeCancel(_cts);
        }
    }

    /// <inheritdoc />
    public void Dispose()
    {
        Cancel();
        lock (_gate)
        {
            _generation++;
            _cts = null;
        }
    }

    private static void SafeCancel(CancellationTokenSource? cts)
    {
        try
        {
            cts?.Cancel();
        }
        catch (ObjectDisposedException)
        {
            // The run has already ended.
        }
    }

    private void Finish(int generation, Action apply)
    {
        lock (_gate)
        {
            if (generation == _generation)
            {
                apply();
            }
        }
    }

    private void Report(int generation, double fraction)
    {
        if (generation != Volatile.Read(ref _generation) || !double.IsFinite(fraction))
        {
            return;
        }

        Progress = Math.Clamp(fraction, 0, 1);
        long now = Stopwatch.GetTimestamp();
        long last = Interlocked.Read(ref _lastNotified);
        if (Stopwatch.GetElapsedTime(last, now) >= ProgressInterval && Interlocked.CompareExchange(ref _lastNotified, now, last) == last)
        {
            Changed?.Invoke();
        }
    }

    /// <summary>Progress of one run: reports of a replaced run are dropped.</summary>
    private sealed class ProgressSink(BackgroundRun<TResult> owner, int generation) : IProgress<double>
    {
        public void Report(double value) => owner.Report(generation, value);
    }
}
