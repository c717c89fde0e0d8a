namespace LoopShaper.Core.Corners;

/// <summary>
/// One toleranced parameter of a design, as multipliers of the entered value: the value at a corner or sample is
/// <see cref="EnteredValue"/> x factor. The nominal factor is 1 except for a derated capacitance (its DC-bias factor);
/// the low and high factors bound the band ("extreme" means one of these two).
/// </summary>
/// <param name="Name">Short name shown in tables: "L", "C[ceramic]", "ESR[ceramic]", "DCR", "Ri", "ramp", "gm", "R1" ... "C3".</param>
/// <param name="Path">The design-file JSON path of the entered value.</param>
/// <param name="Kind">What the parameter is.</param>
/// <param name="Branch">Output-capacitor branch index for capacitance and ESR; -1 otherwise.</param>
/// <param name="EnteredValue">The value in the design, in its own unit (H, F, ohm, V, V/s, S).</param>
/// <param name="NominalFactor">Factor of the nominal corner.</param>
/// <param name="LowFactor">Factor of the low extreme.</param>
/// <param name="HighFactor">Factor of the high extreme.</param>
public sealed record ToleranceParameter(string Name, string Path, ToleranceKind Kind, int Branch, double EnteredValue, double NominalFactor, double LowFactor, double HighFactor)
{
    /// <summary>Mean factor of a normal distribution over the band: (low + high) / 2.</summary>
    public double CentreFactor => 0.5 * (LowFactor + HighFactor);

    /// <summary>Standard deviation of the factor for a normal distribution: the half-band is 3 sigma, (high - low) / 6.</summary>
    public double SigmaFactor => (HighFactor - LowFactor) / 6.0;

    /// <summary>The parameter's value at a factor.</summary>
    public double ValueAt(double factor) => EnteredValue * factor;
}
