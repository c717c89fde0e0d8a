using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>One row of the corner table: where, with which parameter values, what the loop does there and the verdict.</summary>
/// <param name="Corner">The corner.</param>
/// <param name="Condition">Input voltage and load current.</param>
/// <param name="Factors">The factor of every toleranced parameter (in the order of <see cref="CornerTable.Parameters"/>).</param>
/// <param name="Mode">Conduction mode of the operating point; null for custom plants.</param>
/// <param name="Model">The small-signal model used; null when none holds (no load in DCM) or the corner was not analysed.</param>
/// <param name="DutyCycle">Duty cycle; null for custom plants.</param>
/// <param name="Figures">Crossover and margins; null when the corner was not analysed.</param>
/// <param name="LoadStepDeviationV">Peak output deviation after the load step (negative for a step up), V; null when not simulated.</param>
/// <param name="RecoveryTimeS">Time to return within the recovery band, s; null when not simulated or not recovered.</param>
/// <param name="LoopResponse">Loop gain T on the analysis grid, for the overlaid Bode plot; null when not asked for.</param>
/// <param name="Failures">The criteria missed (empty when the corner passes).</param>
/// <param name="Note">Why the corner was not analysed, or a remark; null when there is none.</param>
public sealed record CornerRow(
    CornerPoint Corner,
    OperatingCondition Condition,
    ImmutableArray<double> Factors,
    ConductionMode? Mode,
    SmallSignalModel? Model,
    double? DutyCycle,
    LoopFigures? Figures,
    double? LoadStepDeviationV,
    double? RecoveryTimeS,
    FrequencyResponse? LoopResponse,
    ImmutableArray<string> Failures,
    string? Note)
{
    /// <summary>True when the corner was analysed and meets every criterion.</summary>
    public bool Passed => Figures is not null && Failures.IsEmpty;
}
