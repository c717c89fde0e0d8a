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

    /// <summary>Version of the report layout (2 added the control scheme, the small-signal model, peak current mode, the corners and the ideal-amplifier margins).</summary>
    public int Version { get; init; } = 2;

    /// <summary>Name of the design.</summary>
    public required string Name { get; init; }

    /// <summary>Description of the design.</summary>
    public required string Description { get; init; }

    /// <summary>"buck" or "custom".</summary>
    public required string PlantModel { get; init; }

    /// <summary>"voltageMode" or "peakCurrentMode" for a buck; null for a custom plant.</summary>
    public string? ControlScheme { get; init; }

    /// <summary>
    /// The small-signal model of the main analysis: "voltageModeCcm", "voltageModeDcm", "peakCurrentModeCcm",
    /// "peakCurrentModeDcm" or "custom"; null when the design was not analysed.
    /// </summary>
    public string? SmallSignalModel { get; init; }

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

    /// <summary>Peak current-mode figures (Qp, slopes, ramp for Qp = 1, current loop); null in voltage mode.</summary>
    public CurrentModeReport? CurrentMode { get; init; }

    /// <summary>Margins with an ideal amplifier, when the design's amplifier is not ideal.</summary>
    public IdealAmplifierReport? IdealAmplifier { get; init; }

    /// <summary>The loop at every input and load corner, with the model each used (power-stage plants only).</summary>
    public ImmutableArray<CornerReport> Corners { get; init; } = [];

    /// <summary>The corner table over input, load and tolerances (<see cref="Corners.CornerSweep"/>); null when not computed.</summary>
    public CornerTableReport? CornerTable { get; init; }

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

    /// <summary>
    /// The report of an analysis with its corner table (<see cref="LoopShaper.Core.Corners.CornerSweep"/>, no responses kept) for a
    /// valid power-stage design; the table is null otherwise. What `analyze` and the HTTP API both return.
    /// </summary>
    public static AnalysisReport WithCorners(DesignAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var report = From(analysis);
        if (!analysis.IsValid || analysis.Design.Plant is not BuckPlant)
        {
            return report;
        }

        var table = LoopShaper.Core.Corners.CornerSweep.Run(analysis.Design, new LoopShaper.Core.Corners.CornerSweepOptions(IncludeResponses: false));
        return report with { CornerTable = CornerTableReport.From(table) };
    }

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
            ControlScheme = d.Plant is BuckPlant bp ? (bp.Control is PeakCurrentModeControl ? "peakCurrentMode" : "voltageMode") : null,
            SmallSignalModel = analysis.Model is SmallSignalModel sm ? ModelWord(sm) : null,
            CurrentMode = analysis.CurrentMode is { } cm ? CurrentModeOf(cm, analysis.CurrentLoopMargins) : null,
            IdealAmplifier = analysis.IdealAmplifierMargins is { } im ? new IdealAmplifierReport(Finite(im.CrossoverHz), Finite(im.PhaseMarginDeg), Finite(im.UpperGainMarginDb)) : null,
            Corners = [.. analysis.Corners.Select(CornerOf)],
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

    /// <summary>The report's word for a small-signal model.</summary>
    public static string ModelWord(SmallSignalModel model) => model switch
    {
        PlantModels.SmallSignalModel.VoltageModeContinuous => "voltageModeCcm",
        PlantModels.SmallSignalModel.VoltageModeDiscontinuous => "voltageModeDcm",
        PlantModels.SmallSignalModel.PeakCurrentModeContinuous => "peakCurrentModeCcm",
        PlantModels.SmallSignalModel.PeakCurrentModeDiscontinuous => "peakCurrentModeDcm",
        _ => "custom",
    };

    private static CurrentModeReport CurrentModeOf(PeakCurrentModeFigures f, StabilityMargins? ti) => new(
        Finite(f.SenseGainOhm),
        Finite(f.OnSlopeVPerS),
        Finite(f.OffSlopeVPerS),
        Finite(f.RampSlopeVPerS),
        Finite(f.Mc),
        Finite(f.ModulatorGainPerV),
        Finite(f.FeedforwardGainKf),
        Finite(f.OutputFeedbackGainKr),
        f.IsDiscontinuous ? null : Finite(f.SamplingPoleHz),
        Finite(f.Qp),
        f.IsSubharmonicallyUnstable,
        f.IsDiscontinuous ? null : Finite(f.SuggestedMcForUnityQp),
        f.IsDiscontinuous ? null : Finite(f.SuggestedRampForUnityQpVPerS),
        Finite(ti?.CrossoverHz),
        Finite(ti?.PhaseMarginDeg));

    private static CornerReport CornerOf(CornerResult c) => new(
        c.Input switch { InputCorner.Min => "min", InputCorner.Max => "max", _ => "nominal" },
        c.Load switch { LoadCorner.Min => "min", LoadCorner.Nominal => "nominal", _ => "max" },
        Finite(c.Condition.InputVoltageV),
        Finite(c.Condition.LoadCurrentA),
        c.Mode == ConductionMode.Continuous ? "continuous" : "discontinuous",
        c.Model is SmallSignalModel m ? ModelWord(m) : null,
        Finite(c.DutyCycle),
        Finite(c.CrossoverHz),
        Finite(c.PhaseMarginDeg),
        Finite(c.GainMarginDb),
        c.IsClosedLoopStable,
        Finite(c.Qp),
        c.Note);

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
