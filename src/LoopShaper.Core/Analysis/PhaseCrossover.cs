namespace LoopShaper.Core.Analysis;

/// <summary>A frequency where the continuous phase passes -180 + k 360 degrees, with the gain margin there.</summary>
/// <param name="FrequencyHz">Phase crossover frequency in Hz.</param>
/// <param name="CriticalPhaseDeg">The level crossed: -180 + k 360 degrees.</param>
/// <param name="MagnitudeDb">|T| there in dB.</param>
/// <param name="GainMarginDb">-20 log10 |T|: positive when more gain is needed to reach -1, negative when less.</param>
public sealed record PhaseCrossover(double FrequencyHz, double CriticalPhaseDeg, double MagnitudeDb, double GainMarginDb);
