namespace LoopShaper.Core.PlantModels;

/// <summary>Load current range, amperes; the minimum may be zero (no load).</summary>
/// <param name="MinA">Lightest load.</param>
/// <param name="MaxA">Full load.</param>
/// <param name="NominalA">Typical load, between the two; null takes the mean of the lightest and full load (docs/design-file.md).</param>
public sealed record CurrentRange(double MinA, double MaxA, double? NominalA = null)
{
    /// <summary>The nominal load: <see cref="NominalA"/> when given, else (MinA + MaxA) / 2, amperes.</summary>
    public double EffectiveNominalA => NominalA ?? (0.5 * (MinA + MaxA));
}
