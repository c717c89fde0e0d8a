using LoopShaper.Core.Compensators;

namespace LoopShaper.Core.Synthesis;

/// <summary>The parts of an op-amp network by designator: R1, R2, R3, R4 (divider bottom), C1, C2, C3, as the network's record names them.</summary>
public static class OpAmpNetworkParts
{
    /// <summary>The designator of the divider's bottom resistor.</summary>
    public const string DividerBottom = "R4";

    /// <summary>The parts a network of its type has, with their values and roles; R4 only when the bottom resistor is set.</summary>
    public static IReadOnlyList<(string Designator, PartKind Kind, string Role, double Value)> Of(OpAmpNetwork n)
    {
        var list = new List<(string, PartKind, string, double)>
        {
            ("R1", PartKind.Resistor, n.Type == CompensatorType.TypeIII ? "input resistor and divider top; sets fi with C1 + C2 and the second zero with C3" : "input resistor and divider top; sets fi with C1 + C2", n.R1Ohm),
        };
        if (n.Type == CompensatorType.TypeI)
        {
            list.Add(("C1", PartKind.Capacitor, "integrator capacitor, output to inverting input", n.C1F));
        }
        else
        {
            list.Add(("R2", PartKind.Resistor, "feedback resistor in series with C1; first zero", n.R2Ohm));
            list.Add(("C1", PartKind.Capacitor, "feedback capacitor in series with R2; integrator and first zero", n.C1F));
            list.Add(("C2", PartKind.Capacitor, "capacitor across R2 + C1; first pole", n.C2F));
        }

        if (n.Type == CompensatorType.TypeIII)
        {
            list.Add(("R3", PartKind.Resistor, "resistor in series with C3 across R1; second pole", n.R3Ohm));
            list.Add(("C3", PartKind.Capacitor, "capacitor in series with R3 across R1; second zero and pole", n.C3F));
        }

        if (n.RBottomOhm > 0)
        {
            list.Add((DividerBottom, PartKind.Resistor, "divider bottom, inverting input to ground; sets the DC output voltage only", n.RBottomOhm));
        }

        return list;
    }

    /// <summary>The network with one part's value replaced.</summary>
    public static OpAmpNetwork With(OpAmpNetwork n, string designator, double value) => designator switch
    {
        "R1" => n with { R1Ohm = value },
        "R2" => n with { R2Ohm = value },
        "R3" => n with { R3Ohm = value },
        DividerBottom => n with { RBottomOhm = value },
        "C1" => n with { C1F = value },
        "C2" => n with { C2F = value },
        "C3" => n with { C3F = value },
        _ => throw new ArgumentException($"'{designator}' is not a part of an op-amp network (R1, R2, R3, R4, C1, C2, C3).", nameof(designator)),
    };

    /// <summary>The network with the preferred values of a part list.</summary>
    public static OpAmpNetwork With(OpAmpNetwork n, IEnumerable<SynthesizedPart> parts)
        => parts.Aggregate(n, (acc, p) => With(acc, p.Designator, p.Value.Value));
}
