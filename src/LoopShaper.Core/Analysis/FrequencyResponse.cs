using System.Collections.Immutable;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Analysis;

/// <summary>
/// Magnitude in dB and continuous phase in degrees of a transfer function at a list of frequencies
/// (phase as shared/CONVENTIONS.md defines it; magnitudes clamped to +-400 dB so that a notch never gives -infinity).
/// </summary>
public sealed record FrequencyResponse(ImmutableArray<double> FrequencyHz, ImmutableArray<double> MagnitudeDb, ImmutableArray<double> PhaseDeg)
{
    /// <summary>Largest magnitude reported, in dB; values beyond it are clamped.</summary>
    public const double MagnitudeLimitDb = 400.0;

    /// <summary>The response of a function at the given frequencies in Hz.</summary>
    public static FrequencyResponse Of(TransferFunction h, IReadOnlyList<double> frequencyHz)
    {
        var mag = new double[frequencyHz.Count];
        var ph = new double[frequencyHz.Count];
        for (int i = 0; i < mag.Length; i++)
        {
            double w = 2 * Math.PI * frequencyHz[i];
            h.LogMagnitudeAndPhase(w, out double lm, out double p);
            double db = 20.0 / Math.Log(10.0) * lm;
            mag[i] = double.IsNaN(db) ? -MagnitudeLimitDb : Math.Clamp(db, -MagnitudeLimitDb, MagnitudeLimitDb);
            ph[i] = p * 180.0 / Math.PI;
        }

        return new FrequencyResponse([.. frequencyHz], [.. mag], [.. ph]);
    }

    /// <summary>The response of a function on a grid, with extra points near its poles and zeros.</summary>
    public static FrequencyResponse Of(TransferFunction h, FrequencyGrid grid) => Of(h, grid.Adaptive([h]));

    /// <summary>
    /// The response of the product of two functions on the same frequencies: magnitudes in dB and continuous phases add
    /// (the phase of a product is the sum of the factor angles, so continuity is kept).
    /// </summary>
    public FrequencyResponse Times(FrequencyResponse other)
    {
        if (other.Count != Count)
        {
            throw new ArgumentException("Both responses must share their frequencies.", nameof(other));
        }

        var mag = new double[Count];
        var ph = new double[Count];
        for (int i = 0; i < Count; i++)
        {
            mag[i] = Math.Clamp(MagnitudeDb[i] + other.MagnitudeDb[i], -MagnitudeLimitDb, MagnitudeLimitDb);
            ph[i] = PhaseDeg[i] + other.PhaseDeg[i];
        }

        return new FrequencyResponse(FrequencyHz, [.. mag], [.. ph]);
    }

    /// <summary>Number of points.</summary>
    public int Count => FrequencyHz.Length;
}
