using System.Collections.Immutable;
using System.Globalization;
using System.Numerics;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Analysis;

/// <summary>
/// Finds every gain and phase crossover of a loop gain T(j omega) in a frequency range and derives the margins
/// (shared/CONVENTIONS.md, shared/MARGIN-CASES.md). Crossings are bracketed on a grid in log frequency that is refined
/// until the phase moves less than a few degrees between points, then solved by Brent's method on the analytic
/// function to 1e-12 in ln(omega); nothing is interpolated from the grid and nothing is extrapolated outside the range.
/// </summary>
public static class MarginAnalyzer
{
    private const double RootToleranceLnOmega = 1e-12;
    private const double TouchToleranceLn = 1e-9;
    private const double EdgeToleranceRad = 1e-12;
    private const double MaxPhaseStepRad = 5.0 * Math.PI / 180.0;
    private const int BasePointsPerDecade = 24;
    private const int MaxSamples = 400_000;

    /// <summary>Analyses the loop gain over [startHz, stopHz].</summary>
    public static StabilityMargins Analyze(TransferFunction loop, double startHz, double stopHz)
    {
        if (!(startHz > 0) || !(stopHz > startHz) || !double.IsFinite(stopHz))
        {
            throw new ArgumentOutOfRangeException(nameof(startHz), "The range needs 0 < start < stop, both finite.");
        }

        var notes = new List<string>();
        double lnA = Math.Log(2 * Math.PI * startHz), lnB = Math.Log(2 * Math.PI * stopHz);
        var segments = Segments(loop, lnA, lnB);

        var gain = new List<GainCrossover>();
        var touches = new List<MagnitudeTouch>();
        var phase = new List<PhaseCrossover>();
        foreach (var (a, b) in segments)
        {
            var (u, ph, lm) = RefinedGrid(loop, a, b);
            FindGainCrossings(loop, u, lm, gain, touches);
            FindPhaseCrossings(loop, u, ph, phase);
        }

        gain.Sort((x, y) => x.FrequencyHz.CompareTo(y.FrequencyHz));
        phase.Sort((x, y) => x.FrequencyHz.CompareTo(y.FrequencyHz));
        touches.Sort((x, y) => x.FrequencyHz.CompareTo(y.FrequencyHz));

        var inv = CultureInfo.InvariantCulture;
        double lowDb = Db(loop, lnA), highDb = Db(loop, lnB);
        if (highDb > 0)
        {
            notes.Add(string.Create(inv, $"The loop gain is still above 0 dB ({highDb:F2} dB) at the upper end of the range, {stopHz:G4} Hz: a gain crossover lies above the analysed range."));
        }

        if (lowDb < 0 && gain.Count == 0)
        {
            notes.Add(string.Create(inv, $"The loop gain is below 0 dB ({lowDb:F2} dB) at the lower end of the range, {startHz:G4} Hz, and never reaches 0 dB in range."));
        }

        // Open-loop right-half-plane poles and closed-loop poles (MARGIN-CASES 6).
        int rhp = loop.Poles.Count(p => p.Real > 0);
        if (rhp > 0)
        {
            notes.Add(string.Create(inv, $"The open loop has {rhp} pole(s) in the right half plane: margins alone do not decide stability; the closed-loop poles do."));
        }

        int? pade = null;
        var rational = loop;
        if (loop.HasDelay)
        {
            double wMax = gain.Count == 0 ? 2 * Math.PI * stopHz : 2 * Math.PI * gain.Max(g => g.FrequencyHz) * 3;
            pade = PadeApproximation.SuggestOrder(loop.DelayS, wMax);
            rational = loop.WithPadeDelay(pade.Value);
            notes.Add(string.Create(inv, $"Closed-loop poles use a Pade approximation of order {pade} for the {loop.DelayS:G3} s delay."));
        }

        ImmutableArray<Complex> clPoles = loop.Gain == 0.0 ? [.. rational.AllPoles] : rational.ClosedLoopPoles();
        bool stable = clPoles.All(p => p.Real < -TransferFunction.AxisTolerance * Math.Max(Complex.Abs(p), 1e-300));

        double? delayMargin = null;
        if (stable)
        {
            var positive = gain.Where(g => g.PhaseMarginDeg > 0).ToList();
            if (positive.Count > 0)
            {
                delayMargin = positive.Min(g => g.PhaseMarginDeg * Math.PI / 180.0 / (2 * Math.PI * g.FrequencyHz));
            }
        }

        if (gain.Count > 1)
        {
            notes.Add(string.Create(inv, $"The loop gain crosses 0 dB {gain.Count} times; the smallest phase margin is reported."));
        }

        if (touches.Count > 0)
        {
            notes.Add(string.Create(inv, $"The loop gain touches 0 dB without crossing at {string.Join(", ", touches.Select(t => t.FrequencyHz.ToString("G4", inv)))} Hz."));
        }

        return new StabilityMargins
        {
            StartHz = startHz,
            StopHz = stopHz,
            GainCrossovers = [.. gain],
            PhaseCrossovers = [.. phase],
            Touches = [.. touches],
            DelayMarginS = delayMargin,
            OpenLoopRhpPoleCount = rhp,
            IsClosedLoopStable = stable,
            ClosedLoopPoles = clPoles,
            ClosedLoopPadeOrder = pade,
            Notes = [.. notes],
        };
    }

    /// <summary>Phase margin 180 + phase, the phase continuous from the low-frequency end (shared/CONVENTIONS.md; no folding into 0..360).</summary>
    public static double PhaseMarginFromPhase(double phaseDeg) => 180.0 + phaseDeg;

    private static double Db(TransferFunction t, double lnW) => 20.0 / Math.Log(10.0) * t.LogMagnitude(Math.Exp(lnW));

    /// <summary>Splits the range at the imaginary-axis roots, where the phase jumps by 180 degrees and the magnitude goes to 0 or infinity.</summary>
    private static List<(double A, double B)> Segments(TransferFunction loop, double lnA, double lnB)
    {
        var cuts = loop.AxisRootFrequencies().Select(w => Math.Log(w)).Where(c => c > lnA && c < lnB).Distinct().Order().ToList();
        var result = new List<(double, double)>();
        double a = lnA;
        foreach (var c in cuts)
        {
            result.Add((a, c - 1e-9));
            a = c + 1e-9;
        }

        result.Add((a, lnB));
        return result.Where(s => s.Item2 > s.Item1).ToList();
    }

    /// <summary>
    /// Points in ln(omega): an even grid, the root magnitudes, then bisection wherever the phase moves more than
    /// 5 degrees or the log-magnitude more than 0.5 between neighbours.
    /// </summary>
    private static (List<double> U, List<double> Phase, List<double> LogMagnitude) RefinedGrid(TransferFunction loop, double a, double b)
    {
        int n = Math.Max((int)Math.Ceiling((b - a) / Math.Log(10) * BasePointsPerDecade), 4);
        var u = new List<double>(n + 16);
        for (int i = 0; i <= n; i++)
        {
            u.Add(a + ((b - a) * i / n));
        }

        foreach (var r in loop.Zeros.Concat(loop.Poles))
        {
            double m = Math.Log(r.Magnitude);
            if (m > a && m < b)
            {
                u.Add(m);
            }
        }

        u.Sort();
        var ph = new List<double>(u.Count);
        var lm = new List<double>(u.Count);
        foreach (double x in u)
        {
            loop.LogMagnitudeAndPhase(Math.Exp(x), out double m0, out double p0);
            ph.Add(p0);
            lm.Add(m0);
        }

        var outU = new List<double>(u.Count * 2) { u[0] };
        var outP = new List<double>(u.Count * 2) { ph[0] };
        var outM = new List<double>(u.Count * 2) { lm[0] };
        var stack = new Stack<(double U0, double P0, double M0, double U1, double P1, double M1, int Depth)>();
        for (int i = 0; i + 1 < u.Count; i++)
        {
            stack.Push((u[i], ph[i], lm[i], u[i + 1], ph[i + 1], lm[i + 1], 0));
            while (stack.Count > 0)
            {
                var (u0, p0, m0, u1, p1, m1, depth) = stack.Pop();
                bool coarse = Math.Abs(p1 - p0) > MaxPhaseStepRad || Math.Abs(m1 - m0) > 0.5;
                if (coarse && depth < 40 && u1 - u0 > 1e-10 && outU.Count < MaxSamples)
                {
                    double um = 0.5 * (u0 + u1);
                    loop.LogMagnitudeAndPhase(Math.Exp(um), out double mm, out double pm);
                    stack.Push((um, pm, mm, u1, p1, m1, depth + 1));
                    stack.Push((u0, p0, m0, um, pm, mm, depth + 1));
                }
                else if (u1 > outU[^1])
                {
                    outU.Add(u1);
                    outP.Add(p1);
                    outM.Add(m1);
                }
            }
        }

        return (outU, outP, outM);
    }

    private static void FindGainCrossings(TransferFunction loop, List<double> u, List<double> g, List<GainCrossover> gain, List<MagnitudeTouch> touches)
    {
        double G(double x) => loop.LogMagnitude(Math.Exp(x));
        var roots = new List<double>();
        for (int i = 0; i < u.Count; i++)
        {
            if (g[i] == 0.0)
            {
                roots.Add(u[i]);
                continue;
            }

            if (i + 1 < u.Count && g[i + 1] != 0.0 && Math.Sign(g[i]) != Math.Sign(g[i + 1])
                && ScalarRootFinder.TryBrent(G, u[i], u[i + 1], RootToleranceLnOmega, out double r))
            {
                roots.Add(r);
            }

            // A local extremum of |g| near zero between samples of one sign: a touch, or two crossings the grid straddled.
            if (i > 0 && i + 1 < u.Count && Math.Abs(g[i]) < 0.2
                && Math.Sign(g[i - 1]) == Math.Sign(g[i]) && Math.Sign(g[i + 1]) == Math.Sign(g[i])
                && Math.Abs(g[i]) <= Math.Abs(g[i - 1]) && Math.Abs(g[i]) <= Math.Abs(g[i + 1]))
            {
                double s = Math.Sign(g[i]);
                double xm = ScalarRootFinder.GoldenMinimum(x => s * G(x), u[i - 1], u[i + 1], 1e-12);
                double gm = G(xm);
                if (Math.Abs(gm) <= TouchToleranceLn)
                {
                    touches.Add(new MagnitudeTouch(Math.Exp(xm) / (2 * Math.PI), MarginAnalyzer.PhaseMarginFromPhase(loop.PhaseRad(Math.Exp(xm)) * 180 / Math.PI)));
                }
                else if (Math.Sign(gm) != Math.Sign(g[i]))
                {
                    if (ScalarRootFinder.TryBrent(G, u[i - 1], xm, RootToleranceLnOmega, out double r1))
                    {
                        roots.Add(r1);
                    }

                    if (ScalarRootFinder.TryBrent(G, xm, u[i + 1], RootToleranceLnOmega, out double r2))
                    {
                        roots.Add(r2);
                    }
                }
            }
        }

        roots.Sort();
        for (int i = 0; i < roots.Count; i++)
        {
            // Two roots a hair apart with |T| = 1 to round-off between them are one touch, not two crossings.
            if (i + 1 < roots.Count && roots[i + 1] - roots[i] < 1e-6)
            {
                double mid = 0.5 * (roots[i] + roots[i + 1]);
                if (Math.Abs(G(mid)) <= TouchToleranceLn)
                {
                    double w = Math.Exp(mid);
                    if (!touches.Any(t => Math.Abs(Math.Log(2 * Math.PI * t.FrequencyHz) - mid) < 1e-6))
                    {
                        touches.Add(new MagnitudeTouch(w / (2 * Math.PI), PhaseMarginFromPhase(loop.PhaseRad(w) * 180 / Math.PI)));
                    }

                    i++;
                    continue;
                }
            }

            if (gain.Count > 0 && Math.Abs(Math.Log(2 * Math.PI * gain[^1].FrequencyHz) - roots[i]) < 1e-9)
            {
                continue;
            }

            double wc = Math.Exp(roots[i]);
            double phaseDeg = loop.PhaseRad(wc) * 180 / Math.PI;
            double slope = G(roots[i] + 1e-6) - G(roots[i] - 1e-6);
            gain.Add(new GainCrossover(wc / (2 * Math.PI), phaseDeg, PhaseMarginFromPhase(phaseDeg), slope < 0));
        }
    }

    private static void FindPhaseCrossings(TransferFunction loop, List<double> u, List<double> p, List<PhaseCrossover> result)
    {
        double P(double x) => loop.PhaseRad(Math.Exp(x));
        var found = new List<(double U, int K)>();

        // The critical levels -pi + 2 pi k; level index k of the value pi (2k - 1).
        static double Level(int k) => Math.PI * ((2 * k) - 1);
        for (int i = 0; i + 1 < u.Count; i++)
        {
            double lo = Math.Min(p[i], p[i + 1]), hi = Math.Max(p[i], p[i + 1]);
            int kLo = (int)Math.Ceiling(((lo / Math.PI) + 1) / 2), kHi = (int)Math.Floor(((hi / Math.PI) + 1) / 2);
            for (int k = kLo; k <= kHi; k++)
            {
                double level = Level(k);
                if (p[i] == level)
                {
                    found.Add((u[i], k));
                    continue;
                }

                if (p[i + 1] == level)
                {
                    if (i + 2 == u.Count)
                    {
                        found.Add((u[i + 1], k));
                    }

                    continue;
                }

                if (ScalarRootFinder.TryBrent(x => P(x) - level, u[i], u[i + 1], RootToleranceLnOmega, out double r))
                {
                    found.Add((r, k));
                }
            }

            // A local extremum of the phase near a level between samples on one side of it.
            if (i > 0 && ((p[i] <= p[i - 1] && p[i] <= p[i + 1]) || (p[i] >= p[i - 1] && p[i] >= p[i + 1])))
            {
                bool isMin = p[i] <= p[i - 1] && p[i] <= p[i + 1];
                int k = (int)Math.Round(((p[i] / Math.PI) + 1) / 2);
                double level = Level(k);
                if (Math.Abs(p[i] - level) < MaxPhaseStepRad && Math.Sign(p[i] - level) == Math.Sign(p[i - 1] - level) && Math.Sign(p[i] - level) == Math.Sign(p[i + 1] - level) && p[i] != level)
                {
                    double xm = ScalarRootFinder.GoldenMinimum(x => isMin ? P(x) : -P(x), u[i - 1], u[i + 1], 1e-12);
                    double pm = P(xm);
                    if (Math.Sign(pm - level) != Math.Sign(p[i] - level))
                    {
                        if (ScalarRootFinder.TryBrent(x => P(x) - level, u[i - 1], xm, RootToleranceLnOmega, out double r1))
                        {
                            found.Add((r1, k));
                        }

                        if (ScalarRootFinder.TryBrent(x => P(x) - level, xm, u[i + 1], RootToleranceLnOmega, out double r2))
                        {
                            found.Add((r2, k));
                        }
                    }
                }
            }
        }

        // A crossing that sits on the first or last frequency to round-off (MARGIN-CASES 3).
        foreach (int e in new[] { 0, u.Count - 1 })
        {
            int k = (int)Math.Round(((p[e] / Math.PI) + 1) / 2);
            if (Math.Abs(p[e] - Level(k)) <= EdgeToleranceRad)
            {
                found.Add((u[e], k));
            }
        }

        foreach (var (x, k) in found.OrderBy(f => f.U))
        {
            if (result.Count > 0 && Math.Abs(Math.Log(2 * Math.PI * result[^1].FrequencyHz) - x) < 1e-9)
            {
                continue;
            }

            double w = Math.Exp(x);
            double db = 20.0 / Math.Log(10.0) * loop.LogMagnitude(w);
            if (!double.IsFinite(db))
            {
                continue;
            }

            result.Add(new PhaseCrossover(w / (2 * Math.PI), ((2 * k) - 1) * 180.0, db, -db));
        }
    }
}
