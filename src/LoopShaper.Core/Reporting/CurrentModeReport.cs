namespace LoopShaper.Core.Reporting;

/// <summary>Peak current-mode figures at the analysed operating point (<see cref="PlantModels.PeakCurrentModeFigures"/>); null where they do not exist.</summary>
/// <param name="SenseGainOhm">Ri, V/A.</param>
/// <param name="OnSlopeVPerS">Sn, V/s at the comparator.</param>
/// <param name="OffSlopeVPerS">Sf, V/s.</param>
/// <param name="RampSlopeVPerS">Se, V/s.</param>
/// <param name="Mc">mc = 1 + Se / Sn.</param>
/// <param name="ModulatorGainPerV">Fm = 1 / (mc Sn Ts), 1/V.</param>
/// <param name="Kf">Ridley's kf.</param>
/// <param name="Kr">Ridley's kr.</param>
/// <param name="SamplingPoleHz">fs / 2, Hz.</param>
/// <param name="Qp">Qp = 1 / (pi (mc D' - 0.5)); null in DCM or when the current loop is unstable.</param>
/// <param name="SubharmonicallyUnstable">True when mc D' - 0.5 &lt;= 0 in CCM.</param>
/// <param name="SuggestedMcForUnitQp">mc for Qp = 1.</param>
/// <param name="SuggestedRampForUnitQpVPerS">Se for Qp = 1, V/s (0 when none is needed).</param>
/// <param name="CurrentLoopCrossoverHz">Crossover of the current loop Ti, Hz; null in DCM or when none up to fs.</param>
/// <param name="CurrentLoopPhaseMarginDeg">Phase margin of Ti there, degrees.</param>
public sealed record CurrentModeReport(
    double? SenseGainOhm,
    double? OnSlopeVPerS,
    double? OffSlopeVPerS,
    double? RampSlopeVPerS,
    double? Mc,
    double? ModulatorGainPerV,
    double? Kf,
    double? Kr,
    double? SamplingPoleHz,
    double? Qp,
    bool SubharmonicallyUnstable,
    double? SuggestedMcForUnitQp,
    double? SuggestedRampForUnitQpVPerS,
    double? CurrentLoopCrossoverHz,
    double? CurrentLoopPhaseMarginDeg);
