namespace LoopShaper.Core.Reporting;

/// <summary>The loop with an ideal amplifier beside the real one (a finite-gain op-amp or an OTA).</summary>
/// <param name="CrossoverHz">Worst gain crossover with the ideal amplifier, Hz.</param>
/// <param name="PhaseMarginDeg">Phase margin with the ideal amplifier, degrees.</param>
/// <param name="GainMarginDb">Upper gain margin with the ideal amplifier, dB.</param>
public sealed record IdealAmplifierReport(double? CrossoverHz, double? PhaseMarginDeg, double? GainMarginDb);
