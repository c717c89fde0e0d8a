namespace LoopShaper.Core.Corners;

/// <summary>How a Monte Carlo sample draws each parameter's factor within its band.</summary>
public enum SampleDistribution
{
    /// <summary>Uniform between the low and high extremes.</summary>
    Uniform,

    /// <summary>Normal about the centre of the band, the half-band being 3 sigma (0.27 % of draws fall outside it).</summary>
    Normal,
}
