namespace LoopShaper.Core.PlantModels;

/// <summary>
/// How the PWM modulator of a buck is controlled: voltage mode (<see cref="VoltageModeControl"/>) or peak current
/// mode (<see cref="PeakCurrentModeControl"/>). Both may carry a pure delay (comparator and driver propagation, or a
/// digital controller's computation delay), set in seconds, as a fraction of the switching period, or both (they add).
/// </summary>
/// <param name="ModulatorDelayS">Pure delay of the modulator, seconds.</param>
/// <param name="ModulatorDelayFractionOfPeriod">Further pure delay as a fraction of the switching period Ts (0.5 for half a period).</param>
public abstract record PwmControl(double ModulatorDelayS = 0.0, double ModulatorDelayFractionOfPeriod = 0.0)
{
    /// <summary>The total modulator delay Td = ModulatorDelayS + ModulatorDelayFractionOfPeriod / fs, seconds.</summary>
    public double TotalDelayS(double switchingFrequencyHz) => ModulatorDelayS + (ModulatorDelayFractionOfPeriod / switchingFrequencyHz);
}
