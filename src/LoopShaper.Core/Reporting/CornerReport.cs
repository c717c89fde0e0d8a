namespace LoopShaper.Core.Reporting;

/// <summary>The loop at one corner of the input and load ranges (<see cref="Design.CornerResult"/>).</summary>
/// <param name="Input">"min", "nominal" or "max".</param>
/// <param name="Load">"min" or "max".</param>
/// <param name="InputVoltageV">Input voltage, V.</param>
/// <param name="LoadCurrentA">Load current, A.</param>
/// <param name="ConductionMode">"continuous" or "discontinuous".</param>
/// <param name="Model">The small-signal model used (see <see cref="AnalysisReport.SmallSignalModel"/>); null when none holds.</param>
/// <param name="DutyCycle">Duty cycle.</param>
/// <param name="CrossoverHz">Worst gain crossover, Hz.</param>
/// <param name="PhaseMarginDeg">Phase margin, degrees.</param>
/// <param name="GainMarginDb">Upper gain margin, dB.</param>
/// <param name="ClosedLoopStable">Closed-loop stability; null when not analysed.</param>
/// <param name="Qp">Ridley's Qp (peak current mode in CCM).</param>
/// <param name="Note">Why the corner was not analysed, or a remark.</param>
public sealed record CornerReport(
    string Input,
    string Load,
    double? InputVoltageV,
    double? LoadCurrentA,
    string ConductionMode,
    string? Model,
    double? DutyCycle,
    double? CrossoverHz,
    double? PhaseMarginDeg,
    double? GainMarginDb,
    bool? ClosedLoopStable,
    double? Qp,
    string? Note);
