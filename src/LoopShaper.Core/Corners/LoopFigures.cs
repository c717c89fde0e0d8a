using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Corners;

/// <summary>The stability figures of one loop, as the corner and Monte Carlo tables report them (shared/CONVENTIONS.md).</summary>
/// <param name="CrossoverHz">Gain crossover with the smallest phase margin, Hz; null when |T| does not cross 0 dB in range.</param>
/// <param name="PhaseMarginDeg">Smallest phase margin, degrees; null without a crossover.</param>
/// <param name="UpperGainMarginDb">Upper gain margin, dB (positive); null without such a phase crossover in range.</param>
/// <param name="LowerGainMarginDb">Lower gain margin of a conditionally stable loop, dB (negative); null when there is none.</param>
/// <param name="CrossoverCount">Number of gain crossovers in range.</param>
/// <param name="IsClosedLoopStable">True when every closed-loop pole is in the left half plane.</param>
public sealed record LoopFigures(double? CrossoverHz, double? PhaseMarginDeg, double? UpperGainMarginDb, double? LowerGainMarginDb, int CrossoverCount, bool IsClosedLoopStable)
{
    /// <summary>The figures of a full margin analysis.</summary>
    public static LoopFigures From(StabilityMargins m)
        => new(m.CrossoverHz, m.PhaseMarginDeg, m.UpperGainMarginDb, m.LowerGainMarginDb, m.GainCrossovers.Length, m.IsClosedLoopStable);
}
