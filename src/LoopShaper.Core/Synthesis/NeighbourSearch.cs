using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Tries the neighbouring preferred values of each free part (every combination within +-steps) and keeps the one whose
/// crossover and phase margin come closest to the targets. Each combination is scored on the crossover nearest the target
/// (|T| = 1 solved by Brent's method within a factor 4 of it); the best few are then analysed in full (MarginAnalyzer,
/// worst crossover, closed-loop stability) and the best of those is returned. The same search serves every kind of
/// network: the caller names the parts that stay fixed (the anchors) and how a part list becomes a network.
/// </summary>
internal static class NeighbourSearch
{
    private const int FullAnalyses = 16;
    private const double BracketFactor = 4.0;
    private const int BracketPoints = 24;

    /// <summary>
    /// Runs the search when <see cref="SynthesisOptions.SearchNeighbours"/> asks for it, with its derivation steps
    /// (the search, then the loop with the searched parts, worded by <paramref name="compare"/>) and its warnings.
    /// <paramref name="anchors"/> are the fixed parts in words, for the derivation ("R1 and R4 fixed").
    /// </summary>
    public static (NeighbourSearchResult<TNetwork>? Result, ImmutableArray<Derivation> Steps, ImmutableArray<string> Warnings) Apply<TNetwork>(
        TransferFunction restOfLoop, TNetwork snapped, ImmutableArray<SynthesizedPart> parts, Func<string, bool> isFixed, Func<TNetwork, IEnumerable<SynthesizedPart>, TNetwork> withParts,
        string anchors, Func<string, LoopPerformance, Derivation> compare, SynthesisOptions o, double fcTarget, double pmTarget, double start, double stop)
        where TNetwork : Compensator
    {
        if (!o.SearchNeighbours)
        {
            return (null, [], []);
        }

        if (double.IsNaN(fcTarget) || double.IsNaN(pmTarget))
        {
            return (null, [], ["The neighbour search needs a crossover and a phase margin to aim for, and the ideal loop has no crossover in the analysed range."]);
        }

        var search = Run(restOfLoop, snapped, parts, isFixed, withParts, o, fcTarget, pmTarget, start, stop);
        if (search is null)
        {
            return (null, [], ["The neighbour search found no combination with a stable loop and a crossover in range; the snapped values stand."]);
        }

        var inv = CultureInfo.InvariantCulture;
        var step = new Derivation(
            "Neighbour search",
            string.Create(inv, $"every combination of +-{o.SearchSteps} preferred-value steps per part ({anchors}); distance (100 ln(fc/fc0)/{o.CrossoverScalePct:G3})^2 + ((PM - PM0)/{o.PhaseMarginScaleDeg:G3})^2"),
            string.Create(inv, $"fc0 = {Format(fcTarget, "Hz")}, PM0 = {pmTarget:F2} deg, {search.CandidatesTried} combinations, snapped distance {search.SnappedDistance:G3}"),
            string.Create(inv, $"distance {search.Distance:G3}: ") + string.Join(", ", search.Parts.Where(p => !isFixed(p.Designator)).Select(p => $"{p.Designator} = {Format(p.Value.Value, p.Unit)}")),
            "our search, no source");
        return (search, [step, compare("Loop with the searched parts", search.Performance)], []);
    }

    /// <summary>
    /// The search itself: every combination of +-steps on each part that <paramref name="isFixed"/> leaves free, the
    /// network of each made by <paramref name="withParts"/> and closed with <paramref name="restOfLoop"/>; null when
    /// no combination gives a stable loop with a crossover in range.
    /// </summary>
    public static NeighbourSearchResult<TNetwork>? Run<TNetwork>(
        TransferFunction restOfLoop, TNetwork snapped, ImmutableArray<SynthesizedPart> parts, Func<string, bool> isFixed, Func<TNetwork, IEnumerable<SynthesizedPart>, TNetwork> withParts,
        SynthesisOptions o, double fcTarget, double pmTarget, double start, double stop)
        where TNetwork : Compensator
    {
        var free = parts.Select((p, i) => (p, i)).Where(x => !isFixed(x.p.Designator)).Select(x => x.i).ToArray();
        int width = (2 * o.SearchSteps) + 1;
        int total = (int)Math.Pow(width, free.Length);
        var scored = new List<(double Score, int Code)>(total);
        for (int code = 0; code < total; code++)
        {
            var n = Build(snapped, parts, free, code, o.SearchSteps, withParts, out _);
            scored.Add((Fast(restOfLoop, n.TransferFunction(), fcTarget, pmTarget, o), code));
        }

        double snappedDistance = Distance(LoopPerformance.From(MarginAnalyzer.Analyze(snapped.TransferFunction().Multiply(restOfLoop), start, stop)), fcTarget, pmTarget, o);
        NeighbourSearchResult<TNetwork>? best = null;
        foreach (var (score, code) in scored.Where(s => double.IsFinite(s.Score)).OrderBy(s => s.Score).Take(FullAnalyses))
        {
            var n = Build(snapped, parts, free, code, o.SearchSteps, withParts, out var chosen);
            var perf = LoopPerformance.From(MarginAnalyzer.Analyze(n.TransferFunction().Multiply(restOfLoop), start, stop));
            double d = Distance(perf, fcTarget, pmTarget, o);
            if (double.IsFinite(d) && (best is null || d < best.Distance))
            {
                best = new NeighbourSearchResult<TNetwork>(n, chosen, perf, d, snappedDistance, total);
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

    private static double Fast(TransferFunction restOfLoop, TransferFunction gc, double fcTarget, double pmTarget, SynthesisOptions o)
    {
        double G(double u) => gc.LogMagnitude(Math.Exp(u)) + restOfLoop.LogMagnitude(Math.Exp(u));
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
        double pm = 180.0 + ((gc.PhaseRad(w) + restOfLoop.PhaseRad(w)) * 180.0 / Math.PI);
        return Distance(w / (2 * Math.PI), pm, fcTarget, pmTarget, o);
    }

    /// <summary>
    /// The network of one combination: digit k of the code in base (2 steps + 1) is the offset of free part k. Every
    /// combination is a valid network: with positive parts fp1 / fz1 = (C1 + C2) / C2 &gt; 1 and fp2 / fz2 = (R1 + R3) / R3 &gt; 1
    /// (op-amp), fp / fz = (C1 + C2) / C2 &gt; 1 (OTA).
    /// </summary>
    private static TNetwork Build<TNetwork>(TNetwork snapped, ImmutableArray<SynthesizedPart> parts, int[] free, int code, int steps, Func<TNetwork, IEnumerable<SynthesizedPart>, TNetwork> withParts, out ImmutableArray<SynthesizedPart> chosen)
        where TNetwork : Compensator
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
        return withParts(snapped, chosen);
    }
}
