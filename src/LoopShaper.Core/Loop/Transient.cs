using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Loop;

/// <summary>
/// A closed-loop transient and its figures. The recovery time is the time after the start of the step at which the
/// output enters, for the last time, the band of +-<see cref="RecoveryBand"/> around its final value (null when it has
/// not settled there by the end of the simulation; 0 when it never leaves the band).
/// </summary>
/// <param name="Response">The simulated output deviation (load and line steps) or output (reference step), in V.</param>
/// <param name="StepSize">Size of the applied step in its own unit (A, V).</param>
/// <param name="RiseTimeS">Time the step took to ramp to its full size, s (0 for an ideal step).</param>
/// <param name="PeakDeviationV">Largest excursion from the final value, signed, V.</param>
/// <param name="PeakTimeS">When it occurs, s.</param>
/// <param name="FinalValueV">The analytic final value, V (zero for a load step on an integrating loop); null when unbounded.</param>
/// <param name="RecoveryBand">Half-width of the recovery band, V.</param>
/// <param name="RecoveryTimeS">Recovery time, s; null when the output has not recovered within the simulated time.</param>
public sealed record Transient(StepResponse Response, double StepSize, double RiseTimeS, double PeakDeviationV, double PeakTimeS, double? FinalValueV, double RecoveryBand, double? RecoveryTimeS)
{
    /// <summary>The figures of a simulated response against its final value.</summary>
    public static Transient Of(StepResponse response, double stepSize, double riseTimeS, double? band)
    {
        var t = response.TimeS;
        var y = response.Value;
        double final = response.Metrics.FinalValue ?? 0.0;
        int iPeak = 0;
        for (int k = 1; k < y.Length; k++)
        {
            if (Math.Abs(y[k] - final) > Math.Abs(y[iPeak] - final))
            {
                iPeak = k;
            }
        }

        double peak = y[iPeak] - final;
        double h = band ?? (0.02 * Math.Abs(peak));
        double? recovery = null;
        int last = -1;
        for (int k = y.Length - 1; k >= 0; k--)
        {
            if (Math.Abs(y[k] - final) > h)
            {
                last = k;
                break;
            }
        }

        if (last < 0)
        {
            recovery = 0.0;
        }
        else if (last < y.Length - 1)
        {
            // Linear interpolation of the band entry between the last sample outside and the first inside.
            double e0 = Math.Abs(y[last] - final) - h, e1 = Math.Abs(y[last + 1] - final) - h;
            double f = e0 - e1 != 0 ? e0 / (e0 - e1) : 0.0;
            recovery = t[last] + (f * (t[last + 1] - t[last]));
        }

        return new Transient(response, stepSize, riseTimeS, peak, t[iPeak], response.Metrics.FinalValue, h, recovery);
    }
}
