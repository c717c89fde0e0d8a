using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Exports;

/// <summary>One line of a parts list.</summary>
/// <param name="Designator">Reference designator (R1, C1, ...).</param>
/// <param name="Kind">Resistor or capacitor.</param>
/// <param name="Value">Value in ohms or farads.</param>
/// <param name="Series">Preferred-value series the value comes from; null for a value that was not snapped.</param>
/// <param name="TolerancePct">Tolerance, +- % of the value.</param>
/// <param name="Role">What the part does in the network.</param>
public sealed record PartsListEntry(string Designator, PartKind Kind, double Value, ESeries? Series, double TolerancePct, string Role)
{
    /// <summary>The entry for a synthesised part: its preferred value.</summary>
    public static PartsListEntry From(SynthesizedPart p) => new(p.Designator, p.Kind, p.Value.Value, p.Value.Series, p.Tolerance.TolerancePct, p.Role);

    /// <summary>The unit symbol: "Ohm" or "F".</summary>
    public string Unit => Kind == PartKind.Resistor ? "Ohm" : "F";
}
