namespace LoopShaper.Core.Reporting;

/// <summary>One gain crossover (|T| = 0 dB).</summary>
/// <param name="FrequencyHz">Crossover frequency, Hz.</param>
/// <param name="PhaseDeg">Continuous loop phase there, degrees.</param>
/// <param name="PhaseMarginDeg">Phase margin there, degrees (negative when past -180).</param>
/// <param name="Falling">True when |T| falls through 0 dB as frequency rises.</param>
public sealed record GainCrossoverReport(double? FrequencyHz, double? PhaseDeg, double? PhaseMarginDeg, bool Falling);
