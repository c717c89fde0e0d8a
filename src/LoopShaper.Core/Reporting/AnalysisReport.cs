using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Reporting;

/// <summary>
/// The result of a design analysis as plain data for the command line, files and the HTTP API: every figure carries
/// its unit in its name, "none in the analysed range" and "not computed" are null, never NaN.
/// Written as JSON by <see cref="AnalysisReportJson"/> and as text by <see cref="AnalysisReportText"/>.
/// </summary>
public sealed record AnalysisReport
{
    /// <summary>The value of the "format" field of a JSON report.</summary>
    public const string FormatName = "loopshaper-analysis";

    /// <summary>Always <see cref="FormatName"/>.</summary>
    public string Format { get; init; } = FormatName;

    /// <summary>Version of the report layout.</summary>
    public int Version { get; init; } = 1;

    /// <summary>Name of the design.</summary>
    public required string Name { get; init; }

    /// <summary>Description of the design.</summary>
    public required string Description { get; init; }

    /// <summary>"buck" or "custom".</summary>
    public required string PlantModel { get; init; }

    /// <summary>True when the design had no input errors and was analysed.</summary>
    public required bool Valid { get; init; }

    /// <summary>True when the design is valid and meets every criterion.</summary>
    public required bool MeetsCriteria { get; init; }

    /// <summary>Input errors and warnings with their JSON paths.</summary>
    public required ImmutableArray<IssueReport> Issues { get; init; }

    /// <summary>Operating point (power-stage plants only).</summary>
    public OperatingPointReport? OperatingPoint { get; init; }

    /// <summary>The compensator as analysed.</summary>
    public CompensatorReport? Compensator { get; init; }

    /// <summary>Stability margins.</summary>
    public MarginsReport? Margins { get; init; }

    /// <summary>Reference step.</summary>
    public StepReport? ReferenceStep { get; init; }

    /// <summary>Load step (power-stage plants only).</summary>
    public StepReport? LoadStep { get; init; }

    /// <summary>Each criterion with pass or fail.</summary>
    public required ImmutableArray<CriterionReport> Criteria { get; init; }

    /// <summary>Engineering warnings (DCM, crossover close to switching, hazardous voltage, margin notes ...).</summary>
    public required ImmutableArray<string> Warnings { get; init; }

    /// <summary>The notice every report carries (<see cref="DesignAnalysis.SafetyNotice"/>).</summary>
    public string SafetyNotice { get; init; } = DesignAnalysis.SafetyNotice;

    /// <summary>The report of an analysis.</summary>
    public static AnalysisReport From(DesignAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var d = analysis.Design;
        return new AnalysisReport
        {
            Name = d.Name,
            Description = d.Description,
            PlantModel = d.Plant is CustomPlant ? "custom" : "buck",
            Valid = analysis.IsValid,
            MeetsCriteria = analysis.MeetsCriteria,
            Issues = [.. analysis.Issues.Select(IssueReport.From)],
            OperatingPoint = analysis.OperatingPoint is { } op ? OperatingPointOf(op, d) : null,
            Compensator = analysis.ResolvedPlacement is { } p ? CompensatorOf(p) : null,
            Margins = analysis.Margins is { } m ? MarginsOf(m) : null,
            ReferenceStep = analysis.ReferenceStep is { } r ? StepOf(r, stepV: d.Analysis.ReferenceStepV, stepA: null, slew: null) : null,
            LoadStep = analysis.LoadStep is { } l ? StepOf(l, stepV: null, stepA: d.Analysis.LoadStepA, slew: d.Analysis.LoadStepSlewAPerS) : null,
            Criteria = [.. analysis.Criteria.Select(c => new CriterionReport(c.Name, IssueReport.PathOf(c.Field), c.Passed, c.Actual, c.Limit))],
            Warnings = analysis.Warnings,
        };
    }

    /// <summary>The value when finite, otherwise null: a report never holds NaN or infinity (and -0 is written as 0).</summary>
    internal static double? Finite(double? value) => value is double v && double.IsFinite(v) ? v + 0.0 : null;

    private static OperatingPointReport OperatingPointOf(OperatingPoint op, LoopDesign d)
    {
        double? fullLoad = d.Plant is BuckPlant b ? b.PowerStage.LoadCurrent.MaxA : null;
        return new OperatingPointReport(
            Finite(op.Condition.InputVoltageV),
            Finite(op.Condition.LoadCurrentA),
            Finite(op.DutyCycle),
            Finite(op.IdealDutyCycle),
            Finite(op.LoadResistanceOhm),
            Finite(op.RippleCurrentApp),
            Finite(op.RippleCurrentApp / fullLoad),
            Finite(op.PeakInductorCurrentA),
            Finite(op.ValleyInductorCurrentA),
            Finite(op.OutputRippleVpp),
            op.Mode == ConductionMode.Continuous ? "continuous" : "discontinuous",
            Finite(op.BoundaryLoadCurrentA),
            Finite(op.EffectiveInputVoltageV),
            Finite(op.SeriesResistanceOhm));
    }

    private static CompensatorReport CompensatorOf(CompensatorPlacement p) => new(
        p.Type switch { CompensatorType.TypeI => "typeI", CompensatorType.TypeII => "typeII", _ => "typeIII" },
        Finite(p.Gain.Value),
        p.Type == CompensatorType.TypeI ? null : Finite(p.Zero1Hz),
        p.Type == CompensatorType.TypeIII ? Finite(p.Zero2Hz) : null,
        p.Type == CompensatorType.TypeI ? null : Finite(p.Pole1Hz),
        p.Type == CompensatorType.TypeIII ? Finite(p.Pole2Hz) : null);

    private static MarginsReport MarginsOf(StabilityMargins m) => new(
        Finite(m.StartHz),
        Finite(m.StopHz),
        Finite(m.CrossoverHz),
        Finite(m.PhaseMarginDeg),
        Finite(m.UpperGainMarginDb),
        Finite(m.UpperGainMarginHz),
        Finite(m.LowerGainMarginDb),
        Finite(m.LowerGainMarginHz),
        Finite(m.DelayMarginS),
        m.HasMultipleCrossovers,
        m.IsConditionallyStable,
        m.OpenLoopRhpPoleCount,
        m.IsClosedLoopStable,
        m.ClosedLoopPadeOrder,
        [.. m.GainCrossovers.Select(g => new GainCrossoverReport(Finite(g.FrequencyHz), Finite(g.PhaseDeg), Finite(g.PhaseMarginDeg), g.Falling))],
        [.. m.PhaseCrossovers.Select(p => new PhaseCrossoverReport(Finite(p.FrequencyHz), Finite(p.CriticalPhaseDeg), Finite(p.MagnitudeDb), Finite(p.GainMarginDb)))],
        [.. m.Touches.Select(t => new MagnitudeTouchReport(Finite(t.FrequencyHz), Finite(t.PhaseMarginDeg)))],
        [.. m.ClosedLoopPoles.Select(p => new PoleReport(Finite(p.Real / (2 * Math.PI)), Finite(p.Imaginary / (2 * Math.PI))))]);

    private static StepReport StepOf(StepResponse r, double? stepV, double? stepA, double? slew)
    {
        var k = r.Metrics;
        return new StepReport(
            Finite(stepV),
            Finite(stepA),
            Finite(slew),
            Finite(r.TimeS.IsDefaultOrEmpty ? null : r.TimeS[^1]),
            Finite(k.FinalValue),
            Finite(k.PeakDeviation),
            Finite(k.PeakTimeS),
            Finite(k.OvershootPct),
            Finite(k.UndershootPct),
            Finite(k.RiseTimeS),
            Finite(k.SettlingTimeS),
            Finite(k.SettlingBand),
            r.Delay switch { DelayTreatment.ExactShift => "exactShift", DelayTreatment.Pade => "pade", _ => "none" },
            r.PadeOrder);
    }
}
