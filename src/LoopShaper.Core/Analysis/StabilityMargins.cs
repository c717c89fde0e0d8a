using System.Collections.Immutable;
using System.Numerics;

namespace LoopShaper.Core.Analysis;

/// <summary>
/// Every gain and phase crossover of a loop gain T in an analysed range, and the margins derived from them
/// (shared/CONVENTIONS.md). A null margin means "no crossing in the analysed range", never a number.
/// </summary>
public sealed record StabilityMargins
{
    /// <summary>Lower end of the analysed range, Hz.</summary>
    public required double StartHz { get; init; }

    /// <summary>Upper end of the analysed range, Hz.</summary>
    public required double StopHz { get; init; }

    /// <summary>Every gain crossover in the range, ascending in frequency.</summary>
    public required ImmutableArray<GainCrossover> GainCrossovers { get; init; }

    /// <summary>Every phase crossover in the range, ascending in frequency.</summary>
    public required ImmutableArray<PhaseCrossover> PhaseCrossovers { get; init; }

    /// <summary>Frequencies where |T| touches 0 dB without crossing.</summary>
    public required ImmutableArray<MagnitudeTouch> Touches { get; init; }

    /// <summary>The gain crossover with the smallest phase margin, or null when there is none in range.</summary>
    public GainCrossover? WorstCrossover => GainCrossovers.IsEmpty ? null : GainCrossovers.MinBy(c => c.PhaseMarginDeg);

    /// <summary>Frequency of the worst gain crossover, Hz.</summary>
    public double? CrossoverHz => WorstCrossover?.FrequencyHz;

    /// <summary>The smallest phase margin over all gain crossovers, degrees.</summary>
    public double? PhaseMarginDeg => WorstCrossover?.PhaseMarginDeg;

    /// <summary>The upper gain margin: the smallest gain increase in dB that reaches a critical phase crossing.</summary>
    public double? UpperGainMarginDb => UpperPhaseCrossover?.GainMarginDb;

    /// <summary>Frequency of the upper gain margin, Hz.</summary>
    public double? UpperGainMarginHz => UpperPhaseCrossover?.FrequencyHz;

    /// <summary>The lower gain margin: the smallest gain reduction (a negative number of dB) that reaches a critical phase crossing.</summary>
    public double? LowerGainMarginDb => LowerPhaseCrossover?.GainMarginDb;

    /// <summary>Frequency of the lower gain margin, Hz.</summary>
    public double? LowerGainMarginHz => LowerPhaseCrossover?.FrequencyHz;

    /// <summary>The smallest extra pure delay that makes a crossover critical: min over crossovers of PM / (2 pi fc), seconds; null when the closed loop is unstable or no crossover has a positive margin.</summary>
    public double? DelayMarginS { get; init; }

    /// <summary>True when |T| crosses 0 dB more than once in range.</summary>
    public bool HasMultipleCrossovers => GainCrossovers.Length > 1;

    /// <summary>True when the closed loop is stable and a gain reduction would destabilise it (a lower gain margin exists).</summary>
    public bool IsConditionallyStable => IsClosedLoopStable && LowerPhaseCrossover is not null;

    /// <summary>Number of open-loop poles in the right half plane (after scrubbing round-off).</summary>
    public required int OpenLoopRhpPoleCount { get; init; }

    /// <summary>True when every closed-loop pole, roots of 1 + T = 0, lies strictly in the left half plane.</summary>
    public required bool IsClosedLoopStable { get; init; }

    /// <summary>The closed-loop poles in rad/s.</summary>
    public required ImmutableArray<Complex> ClosedLoopPoles { get; init; }

    /// <summary>Order of the Pade approximation of the loop's delay used for the closed-loop poles, or null when the loop has no delay.</summary>
    public int? ClosedLoopPadeOrder { get; init; }

    /// <summary>Plain-language remarks: crossings near the range ends, right-half-plane poles and the like.</summary>
    public required ImmutableArray<string> Notes { get; init; }

    private PhaseCrossover? UpperPhaseCrossover => PhaseCrossovers.Where(p => p.GainMarginDb > 0).MinBy(p => p.GainMarginDb);

    private PhaseCrossover? LowerPhaseCrossover => PhaseCrossovers.Where(p => p.GainMarginDb < 0).MaxBy(p => p.GainMarginDb);
}
