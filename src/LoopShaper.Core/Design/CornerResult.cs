using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Design;

/// <summary>The loop at one corner of the input and load ranges: which model held there and the margins it gives.</summary>
/// <param name="Input">Input-voltage corner.</param>
/// <param name="Load">Load corner.</param>
/// <param name="Condition">The input voltage and load current of the corner.</param>
/// <param name="Mode">Conduction mode of the operating point.</param>
/// <param name="Model">The small-signal model used; null when none holds (no load in DCM).</param>
/// <param name="DutyCycle">Duty cycle at the corner.</param>
/// <param name="CrossoverHz">Worst gain crossover, Hz; null when none in range or not analysed.</param>
/// <param name="PhaseMarginDeg">Smallest phase margin, degrees; null when none.</param>
/// <param name="GainMarginDb">Upper gain margin, dB; null when none.</param>
/// <param name="IsClosedLoopStable">Closed-loop stability; null when not analysed.</param>
/// <param name="Qp">Peak current mode in CCM: Ridley's Qp; null otherwise or when the current loop is unstable.</param>
/// <param name="Note">Why the corner was not analysed, or a remark; null when there is none.</param>
public sealed record CornerResult(
    InputCorner Input,
    LoadCorner Load,
    OperatingCondition Condition,
    ConductionMode Mode,
    SmallSignalModel? Model,
    double DutyCycle,
    double? CrossoverHz,
    double? PhaseMarginDeg,
    double? GainMarginDb,
    bool? IsClosedLoopStable,
    double? Qp,
    string? Note);
