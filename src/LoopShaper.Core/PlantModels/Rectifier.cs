namespace LoopShaper.Core.PlantModels;

/// <summary>The low-side switch: a synchronous MOSFET with its on-resistance, or a diode with its forward drop.</summary>
/// <param name="Kind">Synchronous or diode.</param>
/// <param name="OnResistanceOhm">Low-side MOSFET on-resistance (synchronous), or the diode's dynamic resistance, ohms.</param>
/// <param name="ForwardDropV">Diode forward drop, volts (zero for a synchronous rectifier).</param>
public sealed record Rectifier(RectifierKind Kind, double OnResistanceOhm, double ForwardDropV = 0.0)
{
    /// <summary>A synchronous low-side MOSFET.</summary>
    public static Rectifier Synchronous(double onResistanceOhm) => new(RectifierKind.Synchronous, onResistanceOhm, 0.0);

    /// <summary>A freewheeling diode.</summary>
    public static Rectifier Diode(double forwardDropV, double resistanceOhm = 0.0) => new(RectifierKind.Diode, resistanceOhm, forwardDropV);
}
