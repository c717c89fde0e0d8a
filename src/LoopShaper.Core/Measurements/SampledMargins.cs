using System.Collections.Immutable;
using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Measurements;

/// <summary>
/// Margins read from a sampled loop gain (a measurement) rather than from a model: every gain and phase crossover
/// between the first and last sample (shared/CONVENTIONS.md), found by <see cref="SampledMarginFinder"/>. A null margin
/// means "no crossing in the measured range". Closed-loop stability cannot be decided from samples and is not claimed.
/// </summary>
public sealed record SampledMargins
{
    /// <summary>Lowest sample, Hz.</summary>
    public required double StartHz { get; init; }

    /// <summary>Highest sample, Hz.</summary>
    public required double StopHz { get; init; }

    /// <summary>Every gain crossover, ascending in frequency.</summary>
    public required ImmutableArray<GainCrossover> GainCrossovers { get; init; }

    /// <summary>Every phase crossover (-180 + k 360 degrees), ascending in frequency.</summary>
    public required ImmutableArray<PhaseCrossover> PhaseCrossovers { get; init; }

    /// <summary>The gain crossover with the smallest phase margin, or null when there is none.</summary>
    public GainCrossover? WorstCrossover => GainCrossovers.IsEmpty ? null : GainCrossovers.MinBy(c => c.PhaseMarginDeg);

    /// <summary>Frequency of the worst gain crossover, Hz.</summary>
    public double? CrossoverHz => WorstCrossover?.FrequencyHz;

    /// <summary>Smallest phase margin over all gain crossovers, degrees.</summary>
    public double? PhaseMarginDeg => WorstCrossover?.PhaseMarginDeg;

    /// <summary>Upper gain margin, dB: the smallest positive -20 log10 |T| at a phase crossover.</summary>
    public double? UpperGainMarginDb => PhaseCrossovers.Where(p => p.GainMarginDb > 0).MinBy(p => p.GainMarginDb)?.GainMarginDb;

    /// <summary>Lower gain margin, dB (negative): the gain reduction that reaches a phase crossover below crossover.</summary>
    public double? LowerGainMarginDb => PhaseCrossovers.Where(p => p.GainMarginDb < 0).MaxBy(p => p.GainMarginDb)?.GainMarginDb;

    /// <summary>True when the samples cross 0 dB more than once.</summary>
    public bool HasMultipleCrossovers => GainCrossovers.Length > 1;
}
