namespace LoopShaper.Core.Reporting;

/// <summary>One part of a synthesised network: ideal, snapped and chosen values in base units (ohms or farads).</summary>
/// <param name="Designator">R1, R2, R3, R4 (divider bottom), C1, C2, C3.</param>
/// <param name="Kind">"resistor" or "capacitor".</param>
/// <param name="Unit">"Ohm" or "F".</param>
/// <param name="Role">What the part does in the network.</param>
/// <param name="IdealValue">The exact value the placement needs.</param>
/// <param name="SnappedValue">The nearest preferred value of the series.</param>
/// <param name="SnappedErrorPct">100 (snapped - ideal) / ideal, %.</param>
/// <param name="ChosenValue">The value to build: the neighbour search's, or the snapped one.</param>
/// <param name="ChosenErrorPct">100 (chosen - ideal) / ideal, %.</param>
/// <param name="Series">"E24", "E96", ...</param>
/// <param name="TolerancePct">Tolerance of the part, +- %.</param>
public sealed record SynthesisPartReport(
    string Designator,
    string Kind,
    string Unit,
    string Role,
    double? IdealValue,
    double? SnappedValue,
    double? SnappedErrorPct,
    double? ChosenValue,
    double? ChosenErrorPct,
    string Series,
    double? TolerancePct);
