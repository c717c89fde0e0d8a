using System.Collections.Immutable;

namespace LoopShaper.Core.Measurements;

/// <summary>Measurement minus model at each measured frequency.</summary>
/// <param name="FrequencyHz">The measured frequencies, Hz.</param>
/// <param name="GainDb">Measured gain minus model gain, dB.</param>
/// <param name="PhaseDeg">Measured phase (aligned, see <see cref="MeasurementComparison.PhaseAlignmentDeg"/>) minus model phase, degrees.</param>
public sealed record ResponseDifference(ImmutableArray<double> FrequencyHz, ImmutableArray<double> GainDb, ImmutableArray<double> PhaseDeg)
{
    /// <summary>Largest |gain difference|, dB.</summary>
    public double MaxAbsGainDb => GainDb.Max(Math.Abs);

    /// <summary>Largest |phase difference|, degrees.</summary>
    public double MaxAbsPhaseDeg => PhaseDeg.Max(Math.Abs);
}
