namespace LoopShaper.Core.Reporting;

/// <summary>A frequency where |T| touches 0 dB without crossing.</summary>
/// <param name="FrequencyHz">Frequency of the touch, Hz.</param>
/// <param name="PhaseMarginDeg">Phase margin there, degrees.</param>
public sealed record MagnitudeTouchReport(double? FrequencyHz, double? PhaseMarginDeg);
