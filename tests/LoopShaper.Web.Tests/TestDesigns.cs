using LoopShaper.Core.Design;

namespace LoopShaper.Web.Tests;

/// <summary>Designs and analyses the tests start from.</summary>
public static class TestDesigns
{
    /// <summary>The workspace's demo design.</summary>
    public static LoopDesign Demo => DemoDesign.Create();

    /// <summary>The demo analysed by the core.</summary>
    public static DesignAnalysis DemoAnalysis { get; } = DesignAnalyzer.Analyze(DemoDesign.Create());
}
