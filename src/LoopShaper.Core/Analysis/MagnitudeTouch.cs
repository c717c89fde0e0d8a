namespace LoopShaper.Core.Analysis;

/// <summary>A frequency where |T| touches 0 dB without crossing it (a tangency, MARGIN-CASES 12).</summary>
/// <param name="FrequencyHz">Frequency of the touch in Hz.</param>
/// <param name="PhaseMarginDeg">Phase margin there, as at a crossover.</param>
public sealed record MagnitudeTouch(double FrequencyHz, double PhaseMarginDeg);
