using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Synthesis;

/// <summary>The figures of a loop that the synthesis compares: from a full margin analysis (MarginAnalyzer).</summary>
/// <param name="CrossoverHz">Crossover with the smallest phase margin, Hz; null when |T| does not cross 0 dB in range.</param>
/// <param name="PhaseMarginDeg">Smallest phase margin, degrees; null without a crossover.</param>
/// <param name="GainMarginDb">Upper gain margin, dB; null without a phase crossover in range.</param>
/// <param name="CrossoverCount">Number of gain crossovers in range.</param>
/// <param name="IsClosedLoopStable">True when every closed-loop pole is in the left half plane.</param>
public sealed record LoopPerformance(double? CrossoverHz, double? PhaseMarginDeg, double? GainMarginDb, int CrossoverCount, bool IsClosedLoopStable)
{
    /// <summary>The figures of a margin analysis.</summary>
    public static LoopPerformance From(StabilityMargins m)
        => new(m.CrossoverHz, m.PhaseMarginDeg, m.UpperGainMarginDb, m.GainCrossovers.Length, m.IsClosedLoopStable);
}
