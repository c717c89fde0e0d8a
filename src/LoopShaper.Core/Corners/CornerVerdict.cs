using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Design;

namespace LoopShaper.Core.Corners;

/// <summary>
/// Judges one corner or sample against the design criteria: closed-loop stability, criteria.minPhaseMarginDeg,
/// criteria.minGainMarginDb (the upper margin, and the size of the lower margin of a conditionally stable loop: gain
/// lowered by less than the limit must not destabilise it), criteria.maxCrossoverFractionOfSwitching,
/// criteria.minCrossoverHz and, when a load step was simulated, criteria.maxLoadStepDeviationV (corners; a Monte Carlo
/// sample has no load step). The ripple (a choice of L at the design point) and reference-step overshoot checks stay
/// with the main analysis.
/// </summary>
public static class CornerVerdict
{
    /// <summary>The criteria a loop misses, each as "field: value vs limit"; empty when it meets them all.</summary>
    public static ImmutableArray<string> Failures(LoopFigures f, DesignCriteria k, double? switchingFrequencyHz, double? loadStepDeviationV = null)
    {
        var inv = CultureInfo.InvariantCulture;
        var r = new List<string>();
        if (!f.IsClosedLoopStable)
        {
            r.Add("closed loop unstable");
        }

        if (f.PhaseMarginDeg is not double pm)
        {
            r.Add("no gain crossover in range");
        }
        else if (pm < k.MinPhaseMarginDeg)
        {
            r.Add(string.Create(inv, $"phase margin {pm:F1} deg < {k.MinPhaseMarginDeg:G4} deg"));
        }

        if (f.UpperGainMarginDb is double gm && gm < k.MinGainMarginDb)
        {
            r.Add(string.Create(inv, $"gain margin {gm:F1} dB < {k.MinGainMarginDb:G4} dB"));
        }

        if (f.LowerGainMarginDb is double lower && -lower < k.MinGainMarginDb)
        {
            r.Add(string.Create(inv, $"lower gain margin {lower:F1} dB: less than {k.MinGainMarginDb:G4} dB of gain reduction destabilises"));
        }

        if (f.CrossoverHz is double fc)
        {
            if (switchingFrequencyHz is double fs && fc > k.MaxCrossoverFractionOfSwitching * fs)
            {
                r.Add(string.Create(inv, $"crossover {fc:G4} Hz > {k.MaxCrossoverFractionOfSwitching:G4} fs"));
            }

            if (k.MinCrossoverHz > 0 && fc < k.MinCrossoverHz)
            {
                r.Add(string.Create(inv, $"crossover {fc:G4} Hz < {k.MinCrossoverHz:G4} Hz"));
            }
        }

        if (k.MaxLoadStepDeviationV is double dv && loadStepDeviationV is double d && Math.Abs(d) > dv)
        {
            r.Add(string.Create(inv, $"load-step deviation {Math.Abs(d):G4} V > {dv:G4} V"));
        }

        return [.. r];
    }
}
