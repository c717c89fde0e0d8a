using System.Globalization;
using LoopShaper.Core.Corners;

namespace LoopShaper.Web.Model;

/// <summary>The Monte Carlo inputs as typed by the engineer: sample count, seed and distribution, read into core settings.</summary>
public sealed class MonteCarloRequest
{
    /// <summary>Text of the sample count.</summary>
    public string SamplesText { get; set; } = "1000";

    /// <summary>Text of the seed.</summary>
    public string SeedText { get; set; } = "1";

    /// <summary>Distribution of every parameter within its band.</summary>
    public SampleDistribution Distribution { get; set; } = SampleDistribution.Uniform;

    /// <summary>Why the sample count cannot be read, or null.</summary>
    public string? SamplesError => TryReadSamples(out _);

    /// <summary>Why the seed cannot be read, or null.</summary>
    public string? SeedError => TryReadSeed(out _);

    /// <summary>The core's settings, or null with the messages when a field cannot be read.</summary>
    public MonteCarloSettings? ToSettings(int? threads)
    {
        if (TryReadSamples(out int n) is not null || TryReadSeed(out ulong seed) is not null)
        {
            return null;
        }

        return new MonteCarloSettings(Samples: n, Seed: seed, Distribution: Distribution, MaxDegreeOfParallelism: threads);
    }

    private string? TryReadSamples(out int samples)
    {
        string t = SamplesText.Trim().Replace("_", string.Empty, StringComparison.Ordinal).Replace(",", string.Empty, StringComparison.Ordinal);
        if (int.TryParse(t, NumberStyles.None, CultureInfo.InvariantCulture, out samples) && samples >= 1 && samples <= MonteCarloSettings.MaxSamples)
        {
            return null;
        }

        return $"Samples: '{SamplesText}' is not a whole number from 1 to {MonteCarloSettings.MaxSamples.ToString("N0", CultureInfo.InvariantCulture)}.";
    }

    private string? TryReadSeed(out ulong seed)
    {
        if (ulong.TryParse(SeedText.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out seed))
        {
            return null;
        }

        return $"Seed: '{SeedText}' is not a whole number from 0 to {ulong.MaxValue.ToString(CultureInfo.InvariantCulture)}.";
    }
}
