using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Tries the neighbouring preferred values of each free part (every combination within +-steps) and keeps the one whose
/// crossover and phase margin come closest to the targets. Each combination is scored on the crossover nearest the target
/// (|T| = 1 solved by Brent's method within a factor 4 of it); the best few are then analysed in full (MarginAnalyzer,
/// worst crossover, closed-loop stability) and the best of those is returned.
/// </summary>
internal static class NeighbourSearch
{
    private const int FullAnalyses = 16;
    private const double BracketFactor = 4.0;
    private const int BracketPoints = 24;

    public static NeighbourSearchResult? Run(TransferFunction plant, OpAmpNetwork snapped, ImmutableArray<SynthesizedPart> parts, SynthesisOptions o, double fcTarget, double pmTarget, double start, double stop)
    {
        var free = parts.Select((p, i) => (p, i)).Where(x => x.p.Designator is not "R1" and not OpAmpNetworkParts.DividerBottom).Select(x => x.i).ToArray();
        int width = (2 * o.SearchSteps) + 1;
        int total = (int)Math.Pow(width, free.Length);
        var scored = new List<(double Score, int Code)>(total);
        for (int code = 0; code < total; code++)
        {
            var n = Build(snapped, parts, free, code, o.SearchSteps, out _);
            scored.Add((Fast(plant, n.TransferFunction(), fcTarget, pmTarget, o), code));
        }

        double snappedDistance = Distance(LoopPerformance.From(MarginAnalyzer.Analyze(snapped.TransferFunction().Multiply(plant), start, stop)), fcTarget, pmTarget, o);
        NeighbourSearchResult? best = null;
        foreach (var (score, code) in scored.Where(s => double.IsFinite(s.Score)).OrderBy(s => s.Score).Take(FullAnalyses))
        {
            var n = Build(snapped, parts, free, code, o.SearchSteps, out var chosen);
            var perf = LoopPerformance.From(MarginAnalyzer.Analyze(n.TransferFunction().Multiply(plant), start, stop));
            double d = Distance(perf, fcTarget, pmTarget, o);
            if (double.IsFinite(d) && (best is null || d < best.Distance))
            {
                best = new NeighbourSearchResult(n, chosen, perf, d, snappedDistance, total);
            }
        }

        return best;
    }

    /// <summary>Distance to the targets: (100 ln(fc / fc0) / scale%)^2 + ((PM - PM0) / scaleDeg)^2; infinite for an unstable loop or one without a crossover.</summary>
    public static double Distance(LoopPerformance p, double fcTarget, double pmTarget, SynthesisOptions o)
        => p.IsClosedLoopStable && p.CrossoverHz is double fc && p.PhaseMarginDeg is double pm ? Distance(fc, pm, fcTarget, pmTarget, o) : double.PositiveInfinity;

    private static double Distance(double fc, double pm, double fcTarget, double pmTarget, SynthesisOptions o)
    {
        double a = 100.0 * Math.Log(fc / fcTarget) / o.CrossoverScalePct;
        double b = (pm - pmTarget) / o.PhaseMarginScaleDeg;
        return (a * a) + (b * b);
    }

    private static double Fast(TransferFunction plant, TransferFunction gc, double fcTarget, double pmTarget, SynthesisOptions o)
    {
        double G(double u) => gc.LogMagnitude(Math.Exp(u)) + plant.LogMagnitude(Math.Exp(u));
        double u0 = Math.Log(2 * Math.PI * fcTarget), span = Math.Log(BracketFactor);
        double? bestU = null;
        double prevU = u0 - span, prevG = G(prevU);
        for (int i = 1; i <= BracketPoints; i++)
        {
            double u = u0 - span + (2 * span * i / BracketPoints);
            double g = G(u);
            if (Math.Sign(g) != Math.Sign(prevG) && ScalarRootFinder.TryBrent(G, prevU, u, 1e-10, out double r)
                && (bestU is null || Math.Abs(r - u0) < Math.Abs(bestU.Value - u0)))
            {
                bestU = r;
            }

            prevU = u;
            prevG = g;
        }

        if (bestU is not double ub)
        {
            return double.PositiveInfinity;
        }

        double w = Math.Exp(ub);
        double pm = 180.0 + ((gc.PhaseRad(w) + plant.PhaseRad(w)) * 180.0 / Math.PI);
        return Distance(w / (2 * Math.PI), pm, fcTarget, pmTarget, o);
    }

    /// <summary>
    /// The network of one combination: digit k of the code in base (2 steps + 1) is the offset of free part k. Every
    /// combination is a valid network: with positive parts fp1 / fz1 = (C1 + C2) / C2 &gt; 1 and fp2 / fz2 = (R1 + R3) / R3 &gt; 1.
    /// </summary>
    private static OpAmpNetwork Build(OpAmpNetwork snapped, ImmutableArray<SynthesizedPart> parts, int[] free, int code, int steps, out ImmutableArray<SynthesizedPart> chosen)
    {
        var list = parts.ToBuilder();
        int c = code, width = (2 * steps) + 1;
        foreach (int i in free)
        {
            int offset = (c % width) - steps;
            c /= width;
            list[i] = parts[i] with { Value = StandardValues.Step(parts[i].Value, offset) };
        }

        chosen = list.ToImmutable();
        return OpAmpNetworkParts.With(snapped, chosen);
    }
}
