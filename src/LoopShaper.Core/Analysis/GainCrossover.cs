namespace LoopShaper.Core.Analysis;

/// <summary>A frequency where |T| = 1 (0 dB), with the phase margin there (shared/CONVENTIONS.md).</summary>
/// <param name="FrequencyHz">Crossover frequency in Hz.</param>
/// <param name="PhaseDeg">Continuous loop phase at the crossover, degrees.</param>
/// <param name="PhaseMarginDeg">180 + phase, with the continuous phase (never folded): negative when the phase is below -180 degrees.</param>
/// <param name="Falling">True when |T| falls through 0 dB as frequency rises.</param>
public sealed record GainCrossover(double FrequencyHz, double PhaseDeg, double PhaseMarginDeg, bool Falling);
