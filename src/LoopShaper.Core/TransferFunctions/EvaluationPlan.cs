using System.Collections.Immutable;
using System.Numerics;

namespace LoopShaper.Core.TransferFunctions;

/// <summary>
/// Precomputed factors of a Bode-form transfer function for fast evaluation on the imaginary axis. A real root r
/// gives 1 - j w / r; a conjugate pair r, r* gives (1 - c2 w^2) - j c1 w with c1 = 2 Re(1/r), c2 = 1/|r|^2. Each
/// factor's angle is taken by atan2, which is continuous along w because the imaginary part keeps its sign (zero for
/// a root on the axis, where the angle jumps from 0 to +pi).
/// </summary>
internal sealed class EvaluationPlan
{
    private readonly double _logGain;
    private readonly double _phase0;
    private readonly int _origin;
    private readonly double _delay;
    private readonly double[] _realZero; // -1/r
    private readonly double[] _realPole;
    private readonly double[] _pairZeroC1;
    private readonly double[] _pairZeroC2;
    private readonly double[] _pairPoleC1;
    private readonly double[] _pairPoleC2;

    private EvaluationPlan(double gain, int origin, double delay, List<double> rz, List<double> rp, List<(double, double)> pz, List<(double, double)> pp)
    {
        _logGain = Math.Log(Math.Abs(gain));
        _phase0 = (gain < 0 ? -Math.PI : 0.0) + (origin * Math.PI / 2.0);
        _origin = origin;
        _delay = delay;
        _realZero = [.. rz];
        _realPole = [.. rp];
        _pairZeroC1 = [.. pz.Select(p => p.Item1)];
        _pairZeroC2 = [.. pz.Select(p => p.Item2)];
        _pairPoleC1 = [.. pp.Select(p => p.Item1)];
        _pairPoleC2 = [.. pp.Select(p => p.Item2)];
    }

    public static EvaluationPlan Build(double gain, int origin, ImmutableArray<Complex> zeros, ImmutableArray<Complex> poles, double delay)
    {
        var (rz, pz) = Split(zeros);
        var (rp, pp) = Split(poles);
        return new EvaluationPlan(gain, origin, delay, rz, rp, pz, pp);
    }

    public void Evaluate(double w, out double logMagnitude, out double phase)
    {
        double ph = _phase0 - (w * _delay);
        double lz = 1.0, lp = 1.0, acc = _logGain + (_origin == 0 ? 0.0 : _origin * Math.Log(w));
        foreach (double a in _realZero)
        {
            double im = a * w;
            lz *= 1.0 + (im * im);
            ph += Math.Atan(im);
            Renormalize(ref lz, ref acc, +1);
        }

        foreach (double a in _realPole)
        {
            double im = a * w;
            lp *= 1.0 + (im * im);
            ph -= Math.Atan(im);
            Renormalize(ref lp, ref acc, -1);
        }

        for (int i = 0; i < _pairZeroC1.Length; i++)
        {
            double re = 1.0 - (_pairZeroC2[i] * w * w), im = 0.0 - (_pairZeroC1[i] * w);
            lz *= (re * re) + (im * im);
            ph += Math.Atan2(im, re);
            Renormalize(ref lz, ref acc, +1);
        }

        for (int i = 0; i < _pairPoleC1.Length; i++)
        {
            double re = 1.0 - (_pairPoleC2[i] * w * w), im = 0.0 - (_pairPoleC1[i] * w);
            lp *= (re * re) + (im * im);
            ph -= Math.Atan2(im, re);
            Renormalize(ref lp, ref acc, -1);
        }

        logMagnitude = acc + (0.5 * (Math.Log(lz) - Math.Log(lp)));
        phase = ph;
    }

    public double LogMagnitude(double w)
    {
        Evaluate(w, out double m, out _);
        return m;
    }

    public double Phase(double w)
    {
        Evaluate(w, out _, out double p);
        return p;
    }

    private static void Renormalize(ref double product, ref double acc, int sign)
    {
        if (product > 1e150 || product < 1e-150)
        {
            acc += sign * 0.5 * Math.Log(product);
            product = 1.0;
        }
    }

    private static (List<double> Real, List<(double C1, double C2)> Pairs) Split(ImmutableArray<Complex> roots)
    {
        var real = new List<double>();
        var pairs = new List<(double, double)>();
        foreach (var r in roots)
        {
            if (r.Imaginary == 0.0)
            {
                // 1 - j w / r: imaginary part -w / r.
                real.Add(-1.0 / r.Real);
            }
            else if (r.Imaginary > 0)
            {
                double m2 = (r.Real * r.Real) + (r.Imaginary * r.Imaginary);
                pairs.Add((2.0 * r.Real / m2, 1.0 / m2));
            }
        }

        return (real, pairs);
    }
}
