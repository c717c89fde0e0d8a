namespace LoopShaper.Core.Synthesis;

/// <summary>One part of a synthesised network: what it does, its ideal value, the preferred value it snapped to and its tolerance.</summary>
/// <param name="Designator">Reference designator: R1, R2, R3, R4 (divider bottom), C1, C2, C3, as in the network's record.</param>
/// <param name="Kind">Resistor or capacitor.</param>
/// <param name="Role">What the part does in the network, in words.</param>
/// <param name="Value">Ideal value and the preferred value chosen (ohms or farads).</param>
/// <param name="Tolerance">Tolerance band of the part.</param>
public sealed record SynthesizedPart(string Designator, PartKind Kind, string Role, StandardValue Value, PartTolerance Tolerance)
{
    /// <summary>The unit symbol of the value: "Ohm" or "F".</summary>
    public string Unit => Kind == PartKind.Resistor ? "Ohm" : "F";
}
