namespace LoopShaper.Core.Reporting;

/// <summary>The operating point of a power-stage plant (<see cref="PlantModels.OperatingPoint"/>), every figure with its unit in its name; null where it does not exist.</summary>
/// <param name="InputVoltageV">Input voltage of the analysis, V.</param>
/// <param name="LoadCurrentA">Load current of the analysis, A.</param>
/// <param name="DutyCycle">Duty cycle with losses, 0..1.</param>
/// <param name="IdealDutyCycle">Vout / Vin.</param>
/// <param name="LoadResistanceOhm">Vout / Iload, ohms; null at no load.</param>
/// <param name="RippleCurrentApp">Inductor ripple current, A peak to peak.</param>
/// <param name="RippleFractionOfFullLoad">Ripple current over the full-load current.</param>
/// <param name="PeakInductorCurrentA">Peak inductor current, A.</param>
/// <param name="ValleyInductorCurrentA">Valley inductor current, A.</param>
/// <param name="OutputRippleVpp">Output ripple, V peak to peak.</param>
/// <param name="ConductionMode">"continuous" or "discontinuous".</param>
/// <param name="BoundaryLoadCurrentA">Load below which a diode rectifier enters DCM, A.</param>
/// <param name="EffectiveInputVoltageV">Small-signal gain from duty cycle, V.</param>
/// <param name="SeriesResistanceOhm">Average series resistance, ohms.</param>
public sealed record OperatingPointReport(
    double? InputVoltageV,
    double? LoadCurrentA,
    double? DutyCycle,
    double? IdealDutyCycle,
    double? LoadResistanceOhm,
    double? RippleCurrentApp,
    double? RippleFractionOfFullLoad,
    double? PeakInductorCurrentA,
    double? ValleyInductorCurrentA,
    double? OutputRippleVpp,
    string ConductionMode,
    double? BoundaryLoadCurrentA,
    double? EffectiveInputVoltageV,
    double? SeriesResistanceOhm);
