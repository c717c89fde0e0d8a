namespace LoopShaper.Core.Reporting;

/// <summary>Figures of a simulated step of the closed loop: the output voltage after a reference step, or its deviation after a load step.</summary>
/// <param name="StepV">Size of the reference step, V (reference step only).</param>
/// <param name="StepA">Size of the load step, A (load step only).</param>
/// <param name="SlewAPerS">Slew rate of the load step, A/s; 0 for an ideal step (load step only).</param>
/// <param name="DurationS">Simulated time, s.</param>
/// <param name="FinalValueV">Analytic final value of the output change, V; null when unbounded.</param>
/// <param name="PeakDeviationV">Largest excursion from the level before the step, signed, V.</param>
/// <param name="PeakTimeS">Time of the peak deviation, s.</param>
/// <param name="OvershootPct">Excursion beyond the final value, % of |final|.</param>
/// <param name="UndershootPct">Excursion opposite to the final value, % of |final|.</param>
/// <param name="RiseTimeS">10 % to 90 % rise time, s.</param>
/// <param name="SettlingTimeS">2 % settling time, s; null when not settled within the simulated time.</param>
/// <param name="SettlingBandV">Half-width of the settling band, V.</param>
/// <param name="DelayTreatment">"none", "exactShift" or "pade": how a pure delay entered the simulation.</param>
/// <param name="PadeOrder">Order of the Pade approximation when one was used.</param>
public sealed record StepReport(
    double? StepV,
    double? StepA,
    double? SlewAPerS,
    double? DurationS,
    double? FinalValueV,
    double? PeakDeviationV,
    double? PeakTimeS,
    double? OvershootPct,
    double? UndershootPct,
    double? RiseTimeS,
    double? SettlingTimeS,
    double? SettlingBandV,
    string DelayTreatment,
    int? PadeOrder);
