namespace LoopShaper.Core.Reporting;

/// <summary>One row of the corner table (<see cref="Corners.CornerRow"/>) as plain data.</summary>
/// <param name="Label">"Vin max, load min, all low".</param>
/// <param name="InputVoltageV">Input voltage, V.</param>
/// <param name="LoadCurrentA">Load current, A.</param>
/// <param name="Model">Small-signal model used (see <see cref="AnalysisReport.SmallSignalModel"/>); null when none.</param>
/// <param name="CrossoverHz">Worst gain crossover, Hz.</param>
/// <param name="PhaseMarginDeg">Phase margin, degrees.</param>
/// <param name="UpperGainMarginDb">Upper gain margin, dB.</param>
/// <param name="LowerGainMarginDb">Lower gain margin, dB.</param>
/// <param name="ClosedLoopStable">Closed-loop stability; null when not analysed.</param>
/// <param name="LoadStepDeviationV">Peak deviation after the load step, V.</param>
/// <param name="RecoveryTimeS">Recovery time into +-1 % of the output, s.</param>
/// <param name="Passed">True when the corner meets every criterion.</param>
/// <param name="Failures">The criteria missed.</param>
public sealed record CornerRowReport(
    string Label,
    double InputVoltageV,
    double LoadCurrentA,
    string? Model,
    double? CrossoverHz,
    double? PhaseMarginDeg,
    double? UpperGainMarginDb,
    double? LowerGainMarginDb,
    bool? ClosedLoopStable,
    double? LoadStepDeviationV,
    double? RecoveryTimeS,
    bool Passed,
    IReadOnlyList<string> Failures);
