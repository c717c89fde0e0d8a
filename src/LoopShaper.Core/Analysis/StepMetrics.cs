namespace LoopShaper.Core.Analysis;

/// <summary>
/// Figures of a step response. Overshoot and undershoot are in % of the final value; settling is the last entry into
/// a band of 2 % of the final value (or of the peak deviation when the final value is zero, as for a load step
/// on an integrating loop); rise time 10 % to 90 % of the final value. Null where a figure does not exist.
/// </summary>
/// <param name="FinalValue">The DC gain of the function (the analytic final value), or null when it is unbounded.</param>
/// <param name="PeakDeviation">The value of largest magnitude: the largest excursion from the level before the step, signed.</param>
/// <param name="PeakTimeS">Time of the peak deviation, seconds.</param>
/// <param name="OvershootPct">Largest excursion beyond the final value, % of |final|.</param>
/// <param name="UndershootPct">Largest excursion in the direction opposite to the final value, % of |final|.</param>
/// <param name="RiseTimeS">10 % to 90 % rise time, seconds.</param>
/// <param name="SettlingTimeS">2 % settling time, seconds, or null when the response has not settled within the simulated time.</param>
/// <param name="SettlingBand">Half-width of the settling band, in output units.</param>
public sealed record StepMetrics(
    double? FinalValue,
    double PeakDeviation,
    double PeakTimeS,
    double? OvershootPct,
    double? UndershootPct,
    double? RiseTimeS,
    double? SettlingTimeS,
    double SettlingBand);
