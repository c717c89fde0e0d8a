using System.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Synthesis;

/// <summary>The corner frequencies of a plant that the resonance placements use, read from its poles and zeros.</summary>
/// <param name="ResonanceHz">Output LC resonance: magnitude of the lowest complex pole pair / 2 pi (or the geometric mean of the two lowest real poles when the filter is overdamped), Hz; null when the plant has fewer than two poles.</param>
/// <param name="ResonanceQ">Quality factor of that pair, |p| / (2 |Re p|); null for real poles.</param>
/// <param name="LoadPoleHz">Lowest real pole (the load pole of a current-mode plant), Hz; null when there is none.</param>
/// <param name="EsrZeroHz">Lowest real left-half-plane zero (the ESR zero of the output capacitors), Hz; null when there is none.</param>
public sealed record PlantFeatures(double? ResonanceHz, double? ResonanceQ, double? LoadPoleHz, double? EsrZeroHz)
{
    /// <summary>Reads the features from a plant's roots.</summary>
    public static PlantFeatures Of(TransferFunction plant)
    {
        var complexPoles = plant.Poles.Where(p => p.Imaginary > 0).OrderBy(p => p.Magnitude).ToList();
        var realPoles = plant.Poles.Where(p => p.Imaginary == 0).Select(p => Math.Abs(p.Real)).Order().ToList();
        double? resonance = null, q = null;
        if (complexPoles.Count > 0 && (realPoles.Count < 2 || complexPoles[0].Magnitude < realPoles[1]))
        {
            Complex p = complexPoles[0];
            resonance = p.Magnitude / (2 * Math.PI);
            q = p.Real == 0.0 ? double.PositiveInfinity : p.Magnitude / (2 * Math.Abs(p.Real));
        }
        else if (realPoles.Count >= 2)
        {
            resonance = Math.Sqrt(realPoles[0] * realPoles[1]) / (2 * Math.PI);
        }

        double? load = realPoles.Count > 0 ? realPoles[0] / (2 * Math.PI) : null;
        var esr = plant.Zeros.Where(z => z.Imaginary == 0 && z.Real < 0).Select(z => -z.Real).Order().ToList();
        return new PlantFeatures(resonance, double.IsPositiveInfinity(q ?? 0) ? null : q, load, esr.Count > 0 ? esr[0] / (2 * Math.PI) : null);
    }
}
