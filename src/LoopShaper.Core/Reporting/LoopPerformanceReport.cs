namespace LoopShaper.Core.Reporting;

/// <summary>The loop figures compared between ideal and standard parts; null means "none in the analysed range".</summary>
/// <param name="CrossoverHz">Crossover with the smallest phase margin, Hz.</param>
/// <param name="PhaseMarginDeg">Smallest phase margin, degrees.</param>
/// <param name="GainMarginDb">Upper gain margin, dB.</param>
/// <param name="CrossoverCount">Number of gain crossovers.</param>
/// <param name="ClosedLoopStable">True when every closed-loop pole is in the left half plane.</param>
public sealed record LoopPerformanceReport(double? CrossoverHz, double? PhaseMarginDeg, double? GainMarginDb, int CrossoverCount, bool ClosedLoopStable);
