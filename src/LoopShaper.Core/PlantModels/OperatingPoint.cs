using System.Collections.Immutable;
using LoopShaper.Core.Derivations;

namespace LoopShaper.Core.PlantModels;

/// <summary>The large-signal steady state of the buck at one input voltage and load.</summary>
/// <param name="Condition">Input voltage and load current.</param>
/// <param name="DutyCycle">Duty cycle with conduction losses and diode drop; in DCM the DCM duty cycle.</param>
/// <param name="IdealDutyCycle">Vout / Vin (common practice, no source).</param>
/// <param name="LoadResistanceOhm">Vout / Iload; null at no load.</param>
/// <param name="RippleCurrentApp">Inductor ripple current, peak to peak, A (in DCM the peak current: the valley is zero).</param>
/// <param name="PeakInductorCurrentA">Iload + ripple / 2, A (in DCM the peak of the current pulse).</param>
/// <param name="ValleyInductorCurrentA">Iload - ripple / 2, A (negative in forced CCM at light load; zero in DCM).</param>
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
    ImmutableArray<Derivation> Derivations)
{
    /// <summary>The duty cycle that CCM volt-second balance gives at this condition (equal to <see cref="DutyCycle"/> in CCM); the boundary load follows from it.</summary>
    public double ContinuousDutyCycle { get; init; } = DutyCycle;

    /// <summary>D2: the fraction of the period the rectifier conducts in DCM; null in CCM (where it is D' = 1 - D).</summary>
    public double? RectifierConductionFraction { get; init; }

    /// <summary>Inductor voltage during the on-interval, Vin - Vout - I (Ron + DCR) in CCM (Vin - Vout in DCM), V.</summary>
    public double OnIntervalInductorVoltageV { get; init; }

    /// <summary>Magnitude of the inductor voltage during the off-interval, Vout + Vf + I (Rlow + DCR) in CCM (Vout + Vf in DCM), V.</summary>
    public double OffIntervalInductorVoltageV { get; init; }
}
