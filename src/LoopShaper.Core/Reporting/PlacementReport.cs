using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Reporting;

/// <summary>A suggested compensator placement as plain data: targets, the placement, the boost and phase-margin figures and every derivation step.</summary>
public sealed record PlacementReport
{
    /// <summary>The value of the "format" field of a JSON report.</summary>
    public const string FormatName = "loopshaper-placement";

    /// <summary>Always <see cref="FormatName"/>.</summary>
    public string Format { get; init; } = FormatName;

    /// <summary>Version of the report layout.</summary>
    public int Version { get; init; } = 1;

    /// <summary>Name of the design.</summary>
    public required string Name { get; init; }

    /// <summary>"kFactor", "voltageModeResonance" or "currentModeResonance".</summary>
    public required string Method { get; init; }

    /// <summary>Target crossover, Hz.</summary>
    public double? TargetCrossoverHz { get; init; }

    /// <summary>Target phase margin, degrees.</summary>
    public double? TargetPhaseMarginDeg { get; init; }

    /// <summary>Switching frequency, Hz, when the plant has one.</summary>
    public double? SwitchingFrequencyHz { get; init; }

    /// <summary>The suggested placement, gain as an integrator frequency.</summary>
    public required CompensatorReport Compensator { get; init; }

    /// <summary>Plant phase at the target crossover, degrees.</summary>
    public double? PlantPhaseDeg { get; init; }

    /// <summary>Boost the target phase margin needs, degrees.</summary>
    public double? RequiredBoostDeg { get; init; }

    /// <summary>Boost the placement gives at the target crossover, degrees.</summary>
    public double? ProvidedBoostDeg { get; init; }

    /// <summary>Phase margin expected at the target crossover, degrees.</summary>
    public double? ExpectedPhaseMarginDeg { get; init; }

    /// <summary>Venable's K factor; null for the resonance methods and Type I.</summary>
    public double? K { get; init; }

    /// <summary>Each step with its formula, numbers and source.</summary>
    public required ImmutableArray<DerivationReport> Derivations { get; init; }

    /// <summary>Where the target cannot be met.</summary>
    public required ImmutableArray<string> Warnings { get; init; }

    /// <summary>The report of a suggestion for a design.</summary>
    public static PlacementReport From(string designName, PlacementSuggestion s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var p = s.Placement;
        return new PlacementReport
        {
            Name = designName,
            Method = s.Request.Method switch
            {
                PlacementMethod.KFactor => "kFactor",
                PlacementMethod.VoltageModeResonance => "voltageModeResonance",
                _ => "currentModeResonance",
            },
            TargetCrossoverHz = AnalysisReport.Finite(s.Request.CrossoverHz),
            TargetPhaseMarginDeg = AnalysisReport.Finite(s.Request.PhaseMarginDeg),
            SwitchingFrequencyHz = AnalysisReport.Finite(s.Request.SwitchingFrequencyHz),
            Compensator = new CompensatorReport(
                SynthesisReport.TypeWord(p.Type),
                AnalysisReport.Finite(p.Gain.Value),
                p.Type == CompensatorType.TypeI ? null : AnalysisReport.Finite(p.Zero1Hz),
                p.Type == CompensatorType.TypeIII ? AnalysisReport.Finite(p.Zero2Hz) : null,
                p.Type == CompensatorType.TypeI ? null : AnalysisReport.Finite(p.Pole1Hz),
                p.Type == CompensatorType.TypeIII ? AnalysisReport.Finite(p.Pole2Hz) : null),
            PlantPhaseDeg = AnalysisReport.Finite(s.PlantPhaseDeg),
            RequiredBoostDeg = AnalysisReport.Finite(s.RequiredBoostDeg),
            ProvidedBoostDeg = AnalysisReport.Finite(s.ProvidedBoostDeg),
            ExpectedPhaseMarginDeg = AnalysisReport.Finite(s.ExpectedPhaseMarginDeg),
            K = AnalysisReport.Finite(s.K),
            Derivations = [.. s.Derivations.Select(SynthesisReport.DerivationOf)],
            Warnings = s.Warnings,
        };
    }
}
