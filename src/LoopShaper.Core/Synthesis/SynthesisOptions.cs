using System.Collections.Immutable;

namespace LoopShaper.Core.Synthesis;

/// <summary>What the component synthesis is asked to do. Every setting has a default; null ones are taken from the design when there is one.</summary>
public sealed record SynthesisOptions
{
    /// <summary>Resistors may come from these series.</summary>
    public static ImmutableArray<ESeries> ResistorSeriesAllowed { get; } = [ESeries.E24, ESeries.E48, ESeries.E96, ESeries.E192];

    /// <summary>Capacitors may come from these series.</summary>
    public static ImmutableArray<ESeries> CapacitorSeriesAllowed { get; } = [ESeries.E6, ESeries.E12, ESeries.E24];

    /// <summary>R1, the input resistor and the divider's top resistor, ohms; null takes the design's divider top resistor, or 10 kOhm.</summary>
    public double? R1Ohm { get; init; }

    /// <summary>Series the resistors snap to (E24, E48, E96, E192).</summary>
    public ESeries ResistorSeries { get; init; } = ESeries.E96;

    /// <summary>Series the capacitors snap to (E6, E12, E24).</summary>
    public ESeries CapacitorSeries { get; init; } = ESeries.E12;

    /// <summary>Tolerance of every resistor unless <see cref="Tolerances"/> names it.</summary>
    public PartTolerance ResistorTolerance { get; init; } = PartTolerance.DefaultResistor;

    /// <summary>Tolerance of every capacitor unless <see cref="Tolerances"/> names it.</summary>
    public PartTolerance CapacitorTolerance { get; init; } = PartTolerance.DefaultCapacitor;

    /// <summary>Tolerances of single parts by designator ("C3" -> 10 %).</summary>
    public ImmutableDictionary<string, PartTolerance> Tolerances { get; init; } = ImmutableDictionary<string, PartTolerance>.Empty;

    /// <summary>True to search the neighbouring preferred values of every part but R1 and the divider bottom.</summary>
    public bool SearchNeighbours { get; init; }

    /// <summary>How many steps up and down the ladder each part may move in the search, 1 to 3.</summary>
    public int SearchSteps { get; init; } = 2;

    /// <summary>Crossover the search aims for, Hz; null takes the design's crossover target, or the crossover with the ideal parts.</summary>
    public double? TargetCrossoverHz { get; init; }

    /// <summary>Phase margin the search aims for, degrees; null takes the phase margin with the ideal parts.</summary>
    public double? TargetPhaseMarginDeg { get; init; }

    /// <summary>
    /// Weight of the crossover in the search's distance: a crossover off by this many % counts as much as a phase margin
    /// off by <see cref="PhaseMarginScaleDeg"/>. Distance = (100 ln(fc / fc0) / scale)^2 + ((PM - PM0) / scalePM)^2 (our choice).
    /// </summary>
    public double CrossoverScalePct { get; init; } = 1.0;

    /// <summary>Weight of the phase margin in the search's distance, degrees.</summary>
    public double PhaseMarginScaleDeg { get; init; } = 1.0;

    /// <summary>Lowest frequency of the margin analyses, Hz; null takes the design's, or 10 Hz.</summary>
    public double? StartHz { get; init; }

    /// <summary>Highest frequency of the margin analyses, Hz; null takes the design's, or 1 MHz.</summary>
    public double? StopHz { get; init; }

    /// <summary>Output voltage for the divider's bottom resistor, V; null takes the design's (no bottom resistor without one).</summary>
    public double? OutputVoltageV { get; init; }

    /// <summary>Reference voltage for the divider's bottom resistor, V; null takes the design's.</summary>
    public double? ReferenceV { get; init; }

    /// <summary>The tolerance of a part.</summary>
    public PartTolerance ToleranceOf(string designator, PartKind kind)
        => Tolerances.TryGetValue(designator, out var t) ? t : kind == PartKind.Resistor ? ResistorTolerance : CapacitorTolerance;
}
