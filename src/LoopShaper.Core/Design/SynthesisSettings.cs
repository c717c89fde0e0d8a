using System.Collections.Immutable;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Design;

/// <summary>
/// The design file's "synthesis" section: how the compensator's parts are chosen (anchor resistor, preferred-value
/// series, neighbour search) and the tolerance of every part, kept for the corner and Monte Carlo analyses
/// (docs/design-file.md). Defaults: E96 resistors at 1 %, E12 capacitors at 5 % (common practice, no source).
/// </summary>
public sealed record SynthesisSettings
{
    /// <summary>The designators a tolerance may be given for: the parts of the op-amp networks (R4 is the divider bottom).</summary>
    public static ImmutableArray<string> Designators { get; } = ["R1", "R2", "R3", "R4", "C1", "C2", "C3"];

    /// <summary>R1, the input resistor and the divider's top resistor, ohms; null takes plant.feedback.topOhm (or the network's R1, or 10 kOhm).</summary>
    public double? R1Ohm { get; init; }

    /// <summary>Series the resistors snap to: E24, E48, E96 or E192.</summary>
    public ESeries ResistorSeries { get; init; } = ESeries.E96;

    /// <summary>Series the capacitors snap to: E6, E12 or E24.</summary>
    public ESeries CapacitorSeries { get; init; } = ESeries.E12;

    /// <summary>Tolerance of every resistor not named in <see cref="TolerancesPct"/>, +- % of its value.</summary>
    public double ResistorTolerancePct { get; init; } = PartTolerance.DefaultResistor.TolerancePct;

    /// <summary>Tolerance of every capacitor not named in <see cref="TolerancesPct"/>, +- % of its value.</summary>
    public double CapacitorTolerancePct { get; init; } = PartTolerance.DefaultCapacitor.TolerancePct;

    /// <summary>Tolerances of single parts by designator ("C3" -> 10), +- %.</summary>
    public ImmutableSortedDictionary<string, double> TolerancesPct { get; init; } = ImmutableSortedDictionary.Create<string, double>(StringComparer.Ordinal);

    /// <summary>True to search the neighbouring preferred values for the parts closest to the targets.</summary>
    public bool SearchNeighbours { get; init; } = true;

    /// <summary>How many preferred-value steps up and down each part may move in the search, 1 to 3.</summary>
    public int SearchSteps { get; init; } = 2;

    /// <summary>The options of the component synthesis these settings ask for.</summary>
    public SynthesisOptions ToOptions() => new()
    {
        R1Ohm = R1Ohm,
        ResistorSeries = ResistorSeries,
        CapacitorSeries = CapacitorSeries,
        ResistorTolerance = new PartTolerance(ResistorTolerancePct),
        CapacitorTolerance = new PartTolerance(CapacitorTolerancePct),
        Tolerances = TolerancesPct.ToImmutableDictionary(t => t.Key, t => new PartTolerance(t.Value), StringComparer.Ordinal),
        SearchNeighbours = SearchNeighbours,
        SearchSteps = SearchSteps,
    };
}
