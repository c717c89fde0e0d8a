using Microsoft.Extensions.Logging.Abstractions;

namespace LoopShaper.Web.Tests;

/// <summary>The background run behind the long computations: progress, cancellation, replacement and disposal.</summary>
public sealed class BackgroundRunTests
{
    [Fact]
    public async Task A_run_reports_progress_and_ends_with_its_result()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        int changes = 0;
        run.Changed += () => Interlocked.Increment(ref changes);
        await run.Start((progress, token) =>
        {
            for (int i = 1; i <= 5; i++)
            {
                progress.Report(i / 5.0);
                Thread.Sleep(30);
            }

            return "done";
        });

        Assert.Equal(RunState.Finished, run.State);
        Assert.Equal("done", run.Result);
        Assert.Equal(1.0, run.Progress);
        Assert.Null(run.StopLatency);
        Assert.True(changes >= 2, $"{changes} change notifications"); // start and end at least
    }

    [Fact]
    public async Task Cancelling_stops_a_cooperative_computation_and_keeps_its_partial_result()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        using var started = new ManualResetEventSlim();
        var task = run.Start((progress, token) =>
        {
            started.Set();
            int i = 0;
            while (!token.IsCancellationRequested && i < 10_000_000)
            {
                Thread.SpinWait(200);
                i++;
            }

            return "partial after " + i;
        });

        Assert.True(started.Wait(TimeSpan.FromSeconds(10)));
        Assert.True(run.IsRunning);
        run.Cancel();
        await task;

        Assert.Equal(RunState.Cancelled, run.State);
        Assert.StartsWith("partial after", run.Result, StringComparison.Ordinal);
        Assert.NotNull(run.StopLatency);
        Assert.False(run.IsRunning);
    }

    [Fact]
    public async Task A_computation_that_throws_on_cancellation_ends_cancelled_not_failed()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        using var started = new ManualResetEventSlim();
        var task = run.Start((progress, token) =>
        {
            started.Set();
            Task.Delay(Timeout.Infinite, token).Wait(token);
            return "never";
        });
        Assert.True(started.Wait(TimeSpan.FromSeconds(10)));
        run.Cancel();
        await task;
        Assert.Equal(RunState.Cancelled, run.State);
        Assert.Null(run.Result);
        Assert.Null(run.Error);
    }

    [Fact]
    public async Task A_failure_is_reported_with_its_message()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        await run.Start((progress, token) => throw new InvalidOperationException("the design has no loop"));
        Assert.Equal(RunState.Failed, run.State);
        Assert.Equal("the design has no loop", run.Error);
    }

    [Fact]
    public async Task A_new_start_replaces_the_run_going_and_the_old_one_cannot_overwrite_it()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        using var release = new ManualResetEventSlim();
        var first = run.Start((progress, token) =>
        {
            release.Wait(TimeSpan.FromSeconds(10), CancellationToken.None);
            progress.Report(0.9);
            return "first";
        });
        var second = run.Start((progress, token) => "second");
        await second;
        release.Set();
        await first;

        Assert.Equal(RunState.Finished, run.State);
        Assert.Equal("second", run.Result);
        Assert.Equal(1.0, run.Progress); // the replaced run's late progress report was dropped
    }

    [Fact]
    public async Task Disposing_cancels_the_run_going()
    {
        var run = new BackgroundRun<string>(NullLogger.Instance);
        CancellationToken seen = default;
        using var started = new ManualResetEventSlim();
        var task = run.Start((progress, token) =>
        {
            seen = token;
            started.Set();
            token.WaitHandle.WaitOne(TimeSpan.FromSeconds(30));
            return "stopped";
        });
        Assert.True(started.Wait(TimeSpan.FromSeconds(10)));
        run.Dispose();
        await task.WaitAsync(TimeSpan.FromSeconds(10));
        Assert.True(seen.IsCancellationRequested);
    }

    [Fact]
    public async Task Progress_notifications_are_throttled()
    {
        using var run = new BackgroundRun<string>(NullLogger.Instance);
        int changes = 0;
        run.Changed += () => Interlocked.Increment(ref changes);
        await run.Start((progress, token) =>
        {
            // 10,000 reports within a few milliseconds: at most a handful of notifications besides start and end.
            for (int i = 0; i < 10_000; i++)
            {
                progress.Report(i / 10_000.0);
            }

            return "fast";
        });
        Assert.InRange(changes, 2, 5);
    }
}
