using LoopShaper.Core.Design;

namespace LoopShaper.Core.Corners;

/// <summary>What a Monte Carlo run draws and where it analyses.</summary>
/// <param name="Samples">Number of samples, 1 to 100,000.</param>
/// <param name="Seed">Seed: the same seed gives the same samples, whatever the number of threads.</param>
/// <param name="Distribution">Distribution of every parameter's factor.</param>
/// <param name="Input">Input corner of the analysis; null takes the design's analysis.input.</param>
/// <param name="Load">Load corner of the analysis; null takes the design's analysis.load.</param>
/// <param name="Tolerances">Tolerances; null takes the design's own, or the defaults.</param>
/// <param name="WorstCount">How many of the worst samples to keep with their parameter values.</param>
/// <param name="HistogramBins">Bins of each histogram.</param>
/// <param name="MaxDegreeOfParallelism">Threads to use; null takes every core.</param>
/// <param name="KeepAllSamples">True to keep every sample in <see cref="MonteCarloResult.AllSamples"/> (for a CSV of the run).</param>
public sealed record MonteCarloSettings(
    int Samples = 1000,
    ulong Seed = 1,
    SampleDistribution Distribution = SampleDistribution.Uniform,
    InputCorner? Input = null,
    LoadCorner? Load = null,
    ToleranceSpec? Tolerances = null,
    int WorstCount = 10,
    int HistogramBins = 40,
    int? MaxDegreeOfParallelism = null,
    bool KeepAllSamples = false)
{
    /// <summary>The largest number of samples a run takes.</summary>
    public const int MaxSamples = 100_000;
}
