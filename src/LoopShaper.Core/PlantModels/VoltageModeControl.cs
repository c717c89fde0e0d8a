namespace LoopShaper.Core.PlantModels;

/// <summary>
/// The voltage-mode PWM modulator: a ramp of fixed amplitude, or one proportional to the input voltage (feedforward),
/// and an optional delay (comparator and driver delay, or a digital controller's computation delay).
/// Fm = 1 / Vm (Erickson and Maksimovic, 2nd ed., sec. 7.3).
/// </summary>
/// <param name="RampAmplitudeV">Peak-to-peak ramp amplitude Vm, V (without feedforward).</param>
/// <param name="InputFeedforward">True when the ramp amplitude follows the input voltage: Vm = k Vin.</param>
/// <param name="FeedforwardRampPerVolt">k in Vm = k Vin, V/V (with feedforward).</param>
/// <param name="ModulatorDelayS">Pure delay of the modulator, seconds.</param>
/// <param name="ModulatorDelayFractionOfPeriod">Further pure delay as a fraction of the switching period.</param>
public sealed record VoltageModeControl(
    double RampAmplitudeV,
    bool InputFeedforward = false,
    double FeedforwardRampPerVolt = 0.0,
    double ModulatorDelayS = 0.0,
    double ModulatorDelayFractionOfPeriod = 0.0) : PwmControl(ModulatorDelayS, ModulatorDelayFractionOfPeriod)
{
    /// <summary>The ramp amplitude at an input voltage, V.</summary>
    public double RampAt(double inputVoltageV) => InputFeedforward ? FeedforwardRampPerVolt * inputVoltageV : RampAmplitudeV;
}
