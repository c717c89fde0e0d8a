using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Loop;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Design;

/// <summary>Everything computed for a design at its main operating point. Null parts were not computed because of input errors.</summary>
public sealed record DesignAnalysis
{
    /// <summary>The analysed design.</summary>
    public required LoopDesign Design { get; init; }

    /// <summary>Input errors and warnings.</summary>
    public required ImmutableArray<ValidationIssue> Issues { get; init; }

    /// <summary>True when the design had no input errors and was analysed.</summary>
    public bool IsValid => Loop is not null;

    /// <summary>The operating point (power-stage plants only).</summary>
    public OperatingPoint? OperatingPoint { get; init; }

    /// <summary>The loop's blocks.</summary>
    public LoopModel? Loop { get; init; }

    /// <summary>Which small-signal plant model the main analysis used (CCM or DCM, voltage or peak current mode).</summary>
    public SmallSignalModel? Model { get; init; }

    /// <summary>Peak current-mode figures at the main operating point (slopes, mc, Fm, kf, kr, Qp, the ramp for Qp = 1); null otherwise.</summary>
    public PeakCurrentModeFigures? CurrentMode { get; init; }

    /// <summary>Inner current-loop gain Ti (peak current mode in CCM); null otherwise.</summary>
    public FrequencyResponse? CurrentLoopResponse { get; init; }

    /// <summary>Margins of the inner current loop Ti (peak current mode in CCM); null otherwise.</summary>
    public StabilityMargins? CurrentLoopMargins { get; init; }

    /// <summary>Compensator with an ideal amplifier, beside the real one (null when the amplifier is ideal).</summary>
    public FrequencyResponse? IdealAmplifierCompensatorResponse { get; init; }

    /// <summary>Loop gain with an ideal amplifier (null when the amplifier is ideal).</summary>
    public FrequencyResponse? IdealAmplifierLoopResponse { get; init; }

    /// <summary>Margins with an ideal amplifier (null when the amplifier is ideal).</summary>
    public StabilityMargins? IdealAmplifierMargins { get; init; }

    /// <summary>
    /// The loop at every corner of the input and load ranges (power-stage plants only), with the model each used; empty
    /// from <see cref="DesignAnalyzer.AnalyzeInteractive"/> for voltage mode.
    /// </summary>
    public ImmutableArray<CornerResult> Corners { get; init; } = [];

    /// <summary>The compensator as a placement, gain resolved (from parts or a crossover target).</summary>
    public CompensatorPlacement? ResolvedPlacement { get; init; }

    /// <summary>Margins of the loop gain over the analysed range.</summary>
    public StabilityMargins? Margins { get; init; }

    /// <summary>Plant Fm Gvd (control voltage to output).</summary>
    public FrequencyResponse? PlantResponse { get; init; }

    /// <summary>Compensator Gc.</summary>
    public FrequencyResponse? CompensatorResponse { get; init; }

    /// <summary>Loop gain T.</summary>
    public FrequencyResponse? LoopResponse { get; init; }

    /// <summary>Output voltage after a reference step of analysis.referenceStepV.</summary>
    public StepResponse? ReferenceStep { get; init; }

    /// <summary>Output voltage deviation after a load step of analysis.loadStepA (power-stage plants only).</summary>
    public StepResponse? LoadStep { get; init; }

    /// <summary>Each design criterion checked.</summary>
    public ImmutableArray<CriterionResult> Criteria { get; init; } = [];

    /// <summary>True when the design is valid and meets every criterion.</summary>
    public bool MeetsCriteria => IsValid && Criteria.All(c => c.Passed);

    /// <summary>Engineering warnings (DCM, crossover close to the switching frequency, hazardous voltage ...).</summary>
    public ImmutableArray<string> Warnings { get; init; } = [];

    /// <summary>How every figure was derived.</summary>
    public ImmutableArray<Derivation> Derivations { get; init; } = [];

    /// <summary>The notice every report carries.</summary>
    public const string SafetyNotice = "Results are small-signal estimates from averaged models. Confirm them by measurement on hardware before relying on them. Local codes, standards and licensed engineering practice prevail.";
}
