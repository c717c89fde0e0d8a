namespace LoopShaper.Core.Synthesis;

/// <summary>
/// The tolerance of one part, symmetric, in % of its value, for the corner and Monte Carlo analyses. Defaults: 1 % for
/// resistors, 5 % for capacitors (common practice, no source; C0G/NP0 parts come in 5 %, X7R in 10 %).
/// </summary>
/// <param name="TolerancePct">Half-width of the band, % of the value (1 for +-1 %), from 0 to 50.</param>
public sealed record PartTolerance(double TolerancePct)
{
    /// <summary>Default resistor tolerance: 1 %.</summary>
    public static PartTolerance DefaultResistor { get; } = new(1.0);

    /// <summary>Default capacitor tolerance: 5 %.</summary>
    public static PartTolerance DefaultCapacitor { get; } = new(5.0);

    /// <summary>The default for a kind of part.</summary>
    public static PartTolerance DefaultFor(PartKind kind) => kind == PartKind.Resistor ? DefaultResistor : DefaultCapacitor;

    /// <summary>The lowest value inside the band: v (1 - tol/100).</summary>
    public double Low(double value) => value * (1.0 - (TolerancePct / 100.0));

    /// <summary>The highest value inside the band: v (1 + tol/100).</summary>
    public double High(double value) => value * (1.0 + (TolerancePct / 100.0));
}
