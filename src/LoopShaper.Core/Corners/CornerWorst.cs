namespace LoopShaper.Core.Corners;

/// <summary>
/// The row index of the worst corner for each figure (null when no corner has the figure): highest and lowest
/// crossover, smallest phase margin, smallest upper gain margin, lower gain margin closest to 0 dB, largest load-step
/// deviation, longest recovery (a corner that has not recovered counts as the longest).
/// </summary>
public sealed record CornerWorst(
    int? HighestCrossover,
    int? LowestCrossover,
    int? PhaseMargin,
    int? UpperGainMargin,
    int? LowerGainMargin,
    int? LoadStepDeviation,
    int? RecoveryTime);
