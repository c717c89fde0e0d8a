using System.Runtime.CompilerServices;

namespace LoopShaper.Web.Tests;

/// <summary>
/// Test-run settings for a loaded two-core machine: the analysis runs on the thread pool, so give the pool enough
/// threads and give bUnit's waits room. These are waits for a condition, not timed assertions.
/// </summary>
internal static class TestSetup
{
    [ModuleInitializer]
    internal static void Initialize()
    {
        ThreadPool.GetMinThreads(out int workers, out int io);
        ThreadPool.SetMinThreads(Math.Max(workers, Environment.ProcessorCount * 4), io);
        BunitContext.DefaultWaitTimeout = TimeSpan.FromSeconds(30);
    }
}
