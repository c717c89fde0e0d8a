using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Reporting;

/// <summary>
/// The result of a component synthesis as plain data for the command line, files and the web app: every part with
/// ideal, snapped and chosen values, the loop with ideal, snapped and chosen parts, and the criteria judged on the
/// design built with the chosen parts. Null means "none in the analysed range", never NaN.
/// Written by <see cref="SynthesisReportJson"/> and <see cref="SynthesisReportText"/>.
/// </summary>
public sealed record SynthesisReport
{
    /// <summary>The value of the "format" field of a JSON report.</summary>
    public const string FormatName = "loopshaper-synthesis";

    /// <summary><see cref="Amplifier"/> of an op-amp network.</summary>
    public const string OpAmp = "opAmp";

    /// <summary><see cref="Amplifier"/> of a transconductance (OTA) network.</summary>
    public const string Ota = "ota";

    /// <summary>Always <see cref="FormatName"/>.</summary>
    public string Format { get; init; } = FormatName;

    /// <summary>Version of the report layout.</summary>
    public int Version { get; init; } = 1;

    /// <summary>Name of the design.</summary>
    public required string Name { get; init; }

    /// <summary>"typeI", "typeII" or "typeIII": the network synthesised.</summary>
    public required string CompensatorType { get; init; }

    /// <summary>The error amplifier the network is for: "opAmp" (voltage-feedback op-amp) or "ota" (transconductance amplifier).</summary>
    public string Amplifier { get; init; } = OpAmp;

    /// <summary>Series of the resistors.</summary>
    public required string ResistorSeries { get; init; }

    /// <summary>Series of the capacitors.</summary>
    public required string CapacitorSeries { get; init; }

    /// <summary>True when the neighbour search was asked for.</summary>
    public required bool SearchNeighbours { get; init; }

    /// <summary>Steps up and down per part in the search.</summary>
    public required int SearchSteps { get; init; }

    /// <summary>Crossover aimed for, Hz.</summary>
    public double? TargetCrossoverHz { get; init; }

    /// <summary>Phase margin aimed for, degrees.</summary>
    public double? TargetPhaseMarginDeg { get; init; }

    /// <summary>Every part of the network.</summary>
    public required ImmutableArray<SynthesisPartReport> Parts { get; init; }

    /// <summary>The loop with the ideal parts.</summary>
    public required LoopPerformanceReport Ideal { get; init; }

    /// <summary>The loop with the snapped parts.</summary>
    public required LoopPerformanceReport Snapped { get; init; }

    /// <summary>The loop with the searched parts; null when no search ran or it found nothing.</summary>
    public LoopPerformanceReport? Searched { get; init; }

    /// <summary>Combinations the search scored; null without a search.</summary>
    public int? SearchCandidates { get; init; }

    /// <summary>True when the design built with the chosen parts meets every criterion.</summary>
    public required bool MeetsCriteria { get; init; }

    /// <summary>Each criterion judged on the design built with the chosen parts.</summary>
    public required ImmutableArray<CriterionReport> Criteria { get; init; }

    /// <summary>Impractical values, missed targets, and the warnings of the design built with the chosen parts.</summary>
    public required ImmutableArray<string> Warnings { get; init; }

    /// <summary>How every part was computed and snapped.</summary>
    public required ImmutableArray<DerivationReport> Derivations { get; init; }

    /// <summary>The report of a design synthesis.</summary>
    public static SynthesisReport From(DesignSynthesis result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var s = result.Synthesis;
        return Of(result.Design, result.Options, s.IdealNetwork.Type, s.Parts, s.ChosenParts, s.Ideal, s.Snapped, s.Search?.Performance, s.Search?.CandidatesTried,
            s.TargetCrossoverHz, s.TargetPhaseMarginDeg, s.Warnings, s.Derivations, result.BuiltAnalysis);
    }

    /// <summary>The report of an OTA design synthesis.</summary>
    public static SynthesisReport From(OtaDesignSynthesis result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var s = result.Synthesis;
        var report = Of(result.Design, result.Options, s.IdealNetwork.Type, s.Parts, s.ChosenParts, s.Ideal, s.Snapped, s.Search?.Performance, s.Search?.CandidatesTried,
            s.TargetCrossoverHz, s.TargetPhaseMarginDeg, s.Warnings, s.Derivations, result.BuiltAnalysis);
        return report with { Amplifier = Ota };
    }

    private static SynthesisReport Of(
        Design.LoopDesign design, SynthesisOptions options, Compensators.CompensatorType type, ImmutableArray<SynthesizedPart> parts, ImmutableArray<SynthesizedPart> chosenParts,
        LoopPerformance ideal, LoopPerformance snapped, LoopPerformance? searched, int? candidates, double targetCrossoverHz, double targetPhaseMarginDeg,
        ImmutableArray<string> synthesisWarnings, ImmutableArray<Derivation> derivations, Design.DesignAnalysis built)
    {
        var chosen = chosenParts.ToDictionary(p => p.Designator, StringComparer.Ordinal);
        var warnings = synthesisWarnings
            .Concat(built.Issues.Where(i => i.Severity == Validation.Severity.Warning).Select(i => $"{IssueReport.PathOf(i.Field)}: {i.Message}"))
            .Concat(built.Warnings)
            .Distinct(StringComparer.Ordinal);
        return new SynthesisReport
        {
            Name = design.Name,
            CompensatorType = TypeWord(type),
            ResistorSeries = options.ResistorSeries.ToString(),
            CapacitorSeries = options.CapacitorSeries.ToString(),
            SearchNeighbours = options.SearchNeighbours,
            SearchSteps = options.SearchSteps,
            TargetCrossoverHz = AnalysisReport.Finite(targetCrossoverHz),
            TargetPhaseMarginDeg = AnalysisReport.Finite(targetPhaseMarginDeg),
            Parts = [.. parts.Select(p =>
            {
                var c = chosen[p.Designator];
                return new SynthesisPartReport(
                    p.Designator,
                    p.Kind == PartKind.Resistor ? "resistor" : "capacitor",
                    p.Unit,
                    p.Role,
                    AnalysisReport.Finite(p.Value.IdealValue),
                    AnalysisReport.Finite(p.Value.Value),
                    AnalysisReport.Finite(p.Value.ErrorPct),
                    AnalysisReport.Finite(c.Value.Value),
                    AnalysisReport.Finite(c.Value.ErrorPct),
                    c.Value.Series.ToString(),
                    AnalysisReport.Finite(c.Tolerance.TolerancePct));
            })],
            Ideal = PerformanceOf(ideal),
            Snapped = PerformanceOf(snapped),
            Searched = searched is { } r ? PerformanceOf(r) : null,
            SearchCandidates = candidates,
            MeetsCriteria = built.MeetsCriteria,
            Criteria = [.. built.Criteria.Select(c => new CriterionReport(c.Name, IssueReport.PathOf(c.Field), c.Passed, c.Actual, c.Limit))],
            Warnings = [.. warnings],
            Derivations = [.. derivations.Select(DerivationOf)],
        };
    }

    /// <summary>The design-file word of a compensator type.</summary>
    internal static string TypeWord(CompensatorType type) => type switch { Compensators.CompensatorType.TypeI => "typeI", Compensators.CompensatorType.TypeII => "typeII", _ => "typeIII" };

    internal static DerivationReport DerivationOf(Derivation d) => new(d.Quantity, d.Formula, d.Substituted, d.Result, d.Source);

    private static LoopPerformanceReport PerformanceOf(LoopPerformance p)
        => new(AnalysisReport.Finite(p.CrossoverHz), AnalysisReport.Finite(p.PhaseMarginDeg), AnalysisReport.Finite(p.GainMarginDb), p.CrossoverCount, p.IsClosedLoopStable);
}
