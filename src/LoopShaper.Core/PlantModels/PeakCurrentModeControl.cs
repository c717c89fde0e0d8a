namespace LoopShaper.Core.PlantModels;

/// <summary>
/// Peak current-mode control: the switch turns off when the sensed inductor current Ri iL plus the external ramp
/// reaches the control voltage (Ridley, "A New, Continuous-Time Model for Current-Mode Control", IEEE Trans. Power
/// Electronics 6(2), 1991). Slopes are in V/s at the comparator: Sn = Ri vL,on / L, Sf = Ri vL,off / L, Se the ramp.
/// </summary>
/// <param name="SenseGainOhm">Current-sense gain Ri, V/A (ohms): sense resistor times the sense amplifier's gain.</param>
/// <param name="Ramp">External compensation ramp Se.</param>
/// <param name="ModulatorDelayS">Pure delay of the comparator and driver, seconds.</param>
/// <param name="ModulatorDelayFractionOfPeriod">Further pure delay as a fraction of the switching period.</param>
public sealed record PeakCurrentModeControl(
    double SenseGainOhm,
    CompensationRamp Ramp,
    double ModulatorDelayS = 0.0,
    double ModulatorDelayFractionOfPeriod = 0.0) : PwmControl(ModulatorDelayS, ModulatorDelayFractionOfPeriod);
