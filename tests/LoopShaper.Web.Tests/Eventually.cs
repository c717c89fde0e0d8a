namespace LoopShaper.Web.Tests;

/// <summary>
/// Waits for a condition that JS interop calls make true: bUnit re-checks its waits on renders only, and a chart's
/// Plotly.react comes after the last render. A wait for a condition, not a timed assertion.
/// </summary>
public static class Eventually
{
    /// <summary>Polls <paramref name="condition"/> every 10 ms until it holds, failing with <paramref name="what"/> after 30 s.</summary>
    public static void True(Func<bool> condition, string what)
    {
        var until = DateTime.UtcNow + TimeSpan.FromSeconds(30);
        while (!condition())
        {
            Assert.True(DateTime.UtcNow < until, "timed out waiting for " + what);
            Thread.Sleep(10);
        }
    }
}
