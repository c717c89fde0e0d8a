using System.Collections.Immutable;
using LoopShaper.Core.Derivations;

namespace LoopShaper.Core.PlantModels;

/// <summary>The large-signal steady state of the buck at one input voltage and load.</summary>
/// <param name="Condition">Input voltage and load current.</param>
/// <param name="DutyCycle">Duty cycle with conduction losses and diode drop.</param>
/// <param name="IdealDutyCycle">Vout / Vin (common practice, no source).</param>
/// <param name="LoadResistanceOhm">Vout / Iload; null at no load.</param>
/// <param name="RippleCurrentApp">Inductor ripple current, peak to peak, A.</param>
/// <param name="PeakInductorCurrentA">Iload + ripple / 2, A.</param>
/// <param name="ValleyInductorCurrentA">Iload - ripple / 2, A (negative in forced CCM at light load).</param>
/// <param name="OutputRippleVpp">Output voltage ripple, peak to peak, V (ripple current through the capacitor bank and load).</param>
/// <param name="Mode">Conduction mode.</param>
/// <param name="BoundaryLoadCurrentA">Load current below which a diode rectifier enters DCM: ripple / 2, A.</param>
/// <param name="EffectiveInputVoltageV">Modulating voltage Vin + Vf - I (Ron - Rlow): the small-signal gain from duty cycle, V.</param>
/// <param name="SeriesResistanceOhm">Average series resistance D Ron + D' Rlow + DCR, ohms.</param>
/// <param name="Derivations">How each figure was obtained.</param>
public sealed record OperatingPoint(
    OperatingCondition Condition,
    double DutyCycle,
    double IdealDutyCycle,
    double? LoadResistanceOhm,
    double RippleCurrentApp,
    double PeakInductorCurrentA,
    double ValleyInductorCurrentA,
    double OutputRippleVpp,
    ConductionMode Mode,
    double BoundaryLoadCurrentA,
    double EffectiveInputVoltageV,
    double SeriesResistanceOhm,
    ImmutableArray<Derivation> Derivations);
