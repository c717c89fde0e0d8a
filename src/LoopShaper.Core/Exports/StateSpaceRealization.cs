using System.Collections.Immutable;
using System.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Exports;

/// <summary>
/// A proper rational transfer function as a cascade of first- and second-order state-space sections times a gain,
/// H(s) = K prod H_k(s / w0_k), each section frequency-scaled by its own w0 so that its coefficients are of order one
/// (a single high-order canonical form would need coefficients spanning many decades). Complex pole pairs make one
/// section each, real poles are paired in order of frequency, complex zero pairs go to the second-order section nearest
/// in frequency, real zeros to the nearest section with room. The pure delay is not part of it.
/// </summary>
public static class StateSpaceRealization
{
    /// <summary>Frequency scale of a section with no root off the origin (a pure integrator or differentiator), rad/s: any positive value is exact.</summary>
    public const double FallbackScaleRadPerS = 2 * Math.PI * 1e3;

    /// <summary>The sections and the gain K of the rational part of <paramref name="h"/>; its delay is left out.</summary>
    /// <exception cref="ArgumentException">The function has more zeros than poles.</exception>
    public static (ImmutableArray<StateSpaceSection> Sections, double Gain) Realize(TransferFunction h)
    {
        if (!h.IsProper)
        {
            throw new ArgumentException("The transfer function has more zeros than poles: it has no state-space realisation.", nameof(h));
        }

        // Pole groups: each complex pair, then the real poles (the origin first) in pairs.
        var groups = new List<List<Complex>>();
        foreach (var p in h.AllPoles.Where(p => p.Imaginary > 0))
        {
            groups.Add([p, Complex.Conjugate(p)]);
        }

        var real = h.AllPoles.Where(p => p.Imaginary == 0).OrderBy(p => p.Magnitude).ToList();
        for (int i = 0; i < real.Count; i += 2)
        {
            groups.Add(i + 1 < real.Count ? [real[i], real[i + 1]] : [real[i]]);
        }

        var zeros = groups.Select(_ => new List<Complex>()).ToList();
        foreach (var z in h.AllZeros.Where(z => z.Imaginary > 0))
        {
            int k = Nearest(groups, zeros, z.Magnitude, 2);
            zeros[k].Add(z);
            zeros[k].Add(Complex.Conjugate(z));
        }

        foreach (var z in h.AllZeros.Where(z => z.Imaginary == 0).OrderBy(z => z.Magnitude))
        {
            zeros[Nearest(groups, zeros, z.Magnitude, 1)].Add(z);
        }

        var sections = ImmutableArray.CreateBuilder<StateSpaceSection>(groups.Count);
        for (int k = 0; k < groups.Count; k++)
        {
            sections.Add(Section(groups[k], zeros[k]));
        }

        return (sections.MoveToImmutable(), h.Gain);
    }

    /// <summary>The section with room for <paramref name="size"/> more zeros whose pole scale is nearest (in log distance) to the zero's magnitude.</summary>
    private static int Nearest(List<List<Complex>> groups, List<List<Complex>> zeros, double magnitude, int size)
    {
        int best = -1;
        double bestDistance = double.PositiveInfinity;
        for (int k = 0; k < groups.Count; k++)
        {
            if (groups[k].Count - zeros[k].Count < size)
            {
                continue;
            }

            double scale = Scale(groups[k]) ?? FallbackScaleRadPerS;
            double distance = magnitude > 0 ? Math.Abs(Math.Log(magnitude / scale)) : 0.0;
            if (distance < bestDistance)
            {
                best = k;
                bestDistance = distance;
            }
        }

        return best >= 0 ? best : throw new InvalidOperationException("No section has room for a zero: the function is not proper.");
    }

    /// <summary>Geometric mean of the magnitudes of the roots off the origin; null when all are at the origin.</summary>
    private static double? Scale(IEnumerable<Complex> roots)
    {
        var m = roots.Where(r => r != Complex.Zero).Select(r => r.Magnitude).ToList();
        return m.Count == 0 ? null : Math.Exp(m.Average(Math.Log));
    }

    /// <summary>
    /// Bode-form factors in s' = s / w0: a root r off the origin gives 1 - (w0 / r) s', one at the origin gives s = w0 s';
    /// the denominator is made monic and the numerator divided by the same leading coefficient.
    /// </summary>
    private static StateSpaceSection Section(List<Complex> poles, List<Complex> zeros)
    {
        double w0 = Scale(poles) ?? Scale(zeros) ?? FallbackScaleRadPerS;
        var den = Product(poles, w0);
        var num = Product(zeros, w0);
        int m = poles.Count;
        double lead = den[m];
        var a = ImmutableArray.CreateBuilder<double>(m);
        for (int i = 0; i < m; i++)
        {
            a.Add(den[i] / lead);
        }

        var b = ImmutableArray.CreateBuilder<double>(m + 1);
        for (int i = 0; i <= m; i++)
        {
            b.Add(i < num.Length ? num[i] / lead : 0.0);
        }

        return new StateSpaceSection(w0, a.MoveToImmutable(), b.MoveToImmutable());
    }

    /// <summary>Real ascending coefficients of prod over the roots of the Bode factor in s' (conjugate pairs make them real).</summary>
    private static double[] Product(List<Complex> roots, double w0)
    {
        var c = new Complex[] { Complex.One };
        foreach (var r in roots)
        {
            var f = r == Complex.Zero ? new[] { Complex.Zero, new Complex(w0, 0) } : new[] { Complex.One, -w0 / r };
            var next = new Complex[c.Length + 1];
            for (int i = 0; i < c.Length; i++)
            {
                next[i] += c[i] * f[0];
                next[i + 1] += c[i] * f[1];
            }

            c = next;
        }

        return [.. c.Select(x => x.Real)];
    }
}
