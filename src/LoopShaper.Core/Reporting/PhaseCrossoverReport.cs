namespace LoopShaper.Core.Reporting;

/// <summary>One phase crossover (phase = -180 + k 360 degrees).</summary>
/// <param name="FrequencyHz">Phase crossover frequency, Hz.</param>
/// <param name="CriticalPhaseDeg">The level crossed, degrees.</param>
/// <param name="MagnitudeDb">|T| there, dB.</param>
/// <param name="GainMarginDb">-20 log10 |T| there, dB: positive when more gain destabilises, negative when less does.</param>
public sealed record PhaseCrossoverReport(double? FrequencyHz, double? CriticalPhaseDeg, double? MagnitudeDb, double? GainMarginDb);
