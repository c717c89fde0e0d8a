using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;
using MathNet.Numerics.LinearAlgebra;
using Complex = System.Numerics.Complex;

namespace LoopShaper.Core.Analysis;

/// <summary>
/// Exact step responses of rational transfer functions: a cascade of first- and second-order state-space sections
/// in time scaled to the function's own frequency, discretised once with the matrix exponential of the augmented
/// system [[A, B], [0, 0]] h (exact for a step input at the sample instants; Franklin, Powell and Workman,
/// Digital Control of Dynamic Systems, sec. 4.3), then stepped. A pure delay is applied as an exact time shift.
/// </summary>
public static class StepSimulator
{
    /// <summary>Default number of samples.</summary>
    public const int DefaultSamples = 2000;

    /// <summary>The response of h to a step of the given amplitude at t = 0.</summary>
    /// <param name="h">A proper transfer function.</param>
    /// <param name="durationS">Simulated time in seconds; null picks ten times the slowest pole's time constant.</param>
    /// <param name="samples">Number of samples, 2 or more.</param>
    /// <param name="amplitude">Step size in input units.</param>
    public static StepResponse Simulate(TransferFunction h, double? durationS = null, int samples = DefaultSamples, double amplitude = 1.0)
    {
        if (!h.IsProper)
        {
            throw new ArgumentException("A step response needs a proper transfer function (no more zeros than poles).", nameof(h));
        }

        samples = Math.Max(samples, 2);
        double delay = h.DelayS;
        var rational = h.WithoutDelay();
        double duration = durationS ?? AutoDuration(rational);
        double active = Math.Max(duration - delay, 0.0);
        var time = new double[samples];
        var y = new double[samples];
        double dt = duration / (samples - 1);
        int firstActive = 0;
        for (int k = 0; k < samples; k++)
        {
            time[k] = k * dt;
            if (time[k] < delay)
            {
                firstActive = k + 1;
            }
        }

        if (rational.Gain != 0.0 && firstActive < samples)
        {
            var (a, b, c, d, w) = Realize(rational);
            int n = a.RowCount;
            // Shift so that the first active sample sits exactly at t - delay.
            double t0 = (firstActive * dt) - delay;
            if (n > 0)
            {
                var xa = new double[n];
                if (t0 > 0)
                {
                    // From rest, one step of length t0 gives x = Gamma(t0).
                    (_, xa) = Discretize(a, b, w * t0);
                }

                var (pa, ga) = Discretize(a, b, w * dt);
                double[] ca = c.ToArray(), xn = new double[n];
                for (int k = firstActive; k < samples; k++)
                {
                    double acc = d;
                    for (int i = 0; i < n; i++)
                    {
                        acc += ca[i] * xa[i];
                    }

                    y[k] = amplitude * acc;
                    for (int i = 0; i < n; i++)
                    {
                        double v = ga[i];
                        int row = i * n;
                        for (int j = 0; j < n; j++)
                        {
                            v += pa[row + j] * xa[j];
                        }

                        xn[i] = v;
                    }

                    (xa, xn) = (xn, xa);
                }
            }
            else
            {
                for (int k = firstActive; k < samples; k++)
                {
                    y[k] = amplitude * d;
                }
            }
        }

        for (int k = 0; k < samples; k++)
        {
            if (!double.IsFinite(y[k]))
            {
                y[k] = y[k] > 0 ? double.MaxValue : double.MinValue;
            }
        }

        double? final = h.DcGain * amplitude;
        var metrics = Metrics(time, y, final);
        return new StepResponse([.. time], [.. y], metrics, h.HasDelay ? DelayTreatment.ExactShift : DelayTreatment.None, null);
    }

    /// <summary>
    /// The response to a step that ramps linearly from 0 to the amplitude over riseTimeS: (A / tr) (r(t) - r(t - tr)),
    /// r the ramp response, the step response of h / s (superposition of two ramps, exact at the samples).
    /// </summary>
    public static StepResponse SimulateSlewed(TransferFunction h, double riseTimeS, double durationS, int samples = DefaultSamples, double amplitude = 1.0)
    {
        if (!(riseTimeS > 0))
        {
            return Simulate(h, durationS, samples, amplitude);
        }

        var ramp = h.Multiply(TransferFunction.FromRoots(1.0, -1, [], []));
        var r1 = Simulate(ramp, durationS, samples, amplitude / riseTimeS);
        var r2 = Simulate(ramp.WithDelay(riseTimeS), durationS, samples, amplitude / riseTimeS);
        var y = new double[samples];
        for (int k = 0; k < y.Length; k++)
        {
            y[k] = r1.Value[k] - r2.Value[k];
        }

        double? final = h.DcGain * amplitude;
        return new StepResponse(r1.TimeS, [.. y], Metrics(r1.TimeS, y, final), h.HasDelay ? DelayTreatment.ExactShift : DelayTreatment.None, null);
    }

    /// <summary>Ten times the slowest non-zero pole's time constant, never less than ten times the fastest's; 1 s without poles.</summary>
    public static double AutoDuration(TransferFunction h)
    {
        var sig = h.Poles.Select(p => Math.Abs(p.Real) > 0 ? Math.Abs(p.Real) : p.Magnitude).Where(s => s > 0).ToList();
        if (sig.Count == 0)
        {
            return 1.0;
        }

        double slow = 10.0 / sig.Min(), fastest = 10.0 / sig.Max();
        return Math.Max(Math.Min(slow, 2000.0 * fastest), fastest);
    }

    /// <summary>Figures of a sampled step response against its analytic final value.</summary>
    public static StepMetrics Metrics(IReadOnlyList<double> t, IReadOnlyList<double> y, double? final)
    {
        int n = y.Count;
        int iPeak = 0;
        for (int k = 1; k < n; k++)
        {
            if (Math.Abs(y[k]) > Math.Abs(y[iPeak]))
            {
                iPeak = k;
            }
        }

        double peak = y[iPeak];
        double? over = null, under = null, rise = null, settle = null;
        double reference = final ?? 0.0;
        bool finalIsZero = final is null || Math.Abs(reference) <= 1e-6 * Math.Abs(peak);
        double band = finalIsZero ? 0.02 * Math.Abs(peak) : 0.02 * Math.Abs(reference);
        if (final is double f && !finalIsZero)
        {
            double maxOver = 0, maxUnder = 0;
            for (int k = 0; k < n; k++)
            {
                maxOver = Math.Max(maxOver, (y[k] - f) / f);
                maxUnder = Math.Max(maxUnder, -y[k] / f);
            }

            over = 100 * maxOver;
            under = 100 * maxUnder;
            double? t10 = FirstCrossing(t, y, 0.1 * f), t90 = FirstCrossing(t, y, 0.9 * f);
            if (t10 is double a && t90 is double b)
            {
                rise = b - a;
            }
        }

        if (final is not null)
        {
            int last = -1;
            for (int k = n - 1; k >= 0; k--)
            {
                if (Math.Abs(y[k] - reference) > band)
                {
                    last = k;
                    break;
                }
            }

            if (last < n - 1)
            {
                settle = last < 0 ? 0.0 : InterpolateBandExit(t, y, last, reference, band);
            }
        }

        return new StepMetrics(final, peak, t[iPeak], over, under, rise, settle, band);
    }

    private static double? FirstCrossing(IReadOnlyList<double> t, IReadOnlyList<double> y, double level)
    {
        for (int k = 1; k < y.Count; k++)
        {
            if ((y[k - 1] - level) * (y[k] - level) <= 0 && y[k] != y[k - 1])
            {
                return t[k - 1] + ((t[k] - t[k - 1]) * (level - y[k - 1]) / (y[k] - y[k - 1]));
            }
        }

        return null;
    }

    private static double InterpolateBandExit(IReadOnlyList<double> t, IReadOnlyList<double> y, int last, double reference, double band)
    {
        double e0 = Math.Abs(y[last] - reference), e1 = Math.Abs(y[last + 1] - reference);
        if (e0 == e1)
        {
            return t[last + 1];
        }

        double frac = (e0 - band) / (e0 - e1);
        return t[last] + (Math.Clamp(frac, 0, 1) * (t[last + 1] - t[last]));
    }

    /// <summary>(Phi, Gamma) = exp([[A, B], [0, 0]] h): the exact zero-order-hold discretisation, Phi row-major.</summary>
    private static (double[] Phi, double[] Gamma) Discretize(Matrix<double> a, Vector<double> b, double h)
    {
        int n = a.RowCount, m = n + 1;
        var aug = new double[m * m];
        for (int i = 0; i < n; i++)
        {
            for (int j = 0; j < n; j++)
            {
                aug[(i * m) + j] = a[i, j] * h;
            }

            aug[(i * m) + n] = b[i] * h;
        }

        var e = MatrixExponential.Of(aug, m);
        var phi = new double[n * n];
        var gamma = new double[n];
        for (int i = 0; i < n; i++)
        {
            for (int j = 0; j < n; j++)
            {
                phi[(i * n) + j] = e[(i * m) + j];
            }

            gamma[i] = e[(i * m) + n];
        }

        return (phi, gamma);
    }

    /// <summary>
    /// A cascade realisation in scaled time tau = w t: sections of one or two poles, each in controllable form,
    /// with the zeros shared out among them; H(x) = G prod N_i(x) / D_i(x), x = s / w.
    /// </summary>
    private static (Matrix<double> A, Vector<double> B, Vector<double> C, double D, double W) Realize(TransferFunction h)
    {
        double w = TransferFunction.FrequencyScale(h.Zeros.Concat(h.Poles));
        var poles = h.AllPoles.Select(p => p / w).ToList();
        var zeros = h.AllZeros.Select(z => z / w).ToList();

        // G = K w^n prod(-p') / prod(-z') over the non-zero roots.
        Complex gc = h.Gain * Math.Pow(w, h.OriginOrder);
        foreach (var p in h.Poles)
        {
            gc *= -p / w;
        }

        foreach (var z in h.Zeros)
        {
            gc /= -z / w;
        }

        double g = gc.Real;

        var sections = new List<(List<Complex> Poles, List<Complex> Zeros)>();
        foreach (var p in poles.Where(p => p.Imaginary > 0))
        {
            sections.Add(([p, Complex.Conjugate(p)], []));
        }

        var realPoles = poles.Where(p => p.Imaginary == 0).OrderBy(p => p.Real).ToList();
        for (int i = 0; i < realPoles.Count; i += 2)
        {
            sections.Add(i + 1 < realPoles.Count ? ([realPoles[i], realPoles[i + 1]], []) : ([realPoles[i]], []));
        }

        foreach (var z in zeros.Where(z => z.Imaginary > 0))
        {
            var target = sections.First(s => s.Poles.Count == 2 && s.Zeros.Count == 0);
            target.Zeros.Add(z);
            target.Zeros.Add(Complex.Conjugate(z));
        }

        foreach (var z in zeros.Where(z => z.Imaginary == 0))
        {
            var target = sections.First(s => s.Zeros.Count < s.Poles.Count);
            target.Zeros.Add(z);
        }

        var build = Matrix<double>.Build;
        var vb = Vector<double>.Build;
        Matrix<double> a = build.Dense(0, 0);
        Vector<double> b = vb.Dense(0), c = vb.Dense(0);
        double d = 1.0;
        foreach (var (sp, sz) in sections)
        {
            var den = Monic(sp);
            var num = Monic(sz);
            var (sa, sb, sc, sd) = Section(den, num);
            int n0 = a.RowCount, n1 = sa.RowCount;
            var na = build.Dense(n0 + n1, n0 + n1);
            if (n0 > 0)
            {
                na.SetSubMatrix(0, 0, a);
                na.SetSubMatrix(n0, 0, sb.ToColumnMatrix() * c.ToRowMatrix());
            }

            na.SetSubMatrix(n0, n0, sa);
            var nb = vb.Dense(n0 + n1);
            if (n0 > 0)
            {
                nb.SetSubVector(0, n0, b);
            }

            nb.SetSubVector(n0, n1, sb * d);
            var nc = vb.Dense(n0 + n1);
            if (n0 > 0)
            {
                nc.SetSubVector(0, n0, c * sd);
            }

            nc.SetSubVector(n0, n1, sc);
            a = na;
            b = nb;
            c = nc;
            d *= sd;
        }

        return (a, b, c * g, d * g, w);
    }

    /// <summary>Coefficients ascending of prod(x - r), real.</summary>
    private static double[] Monic(List<Complex> roots)
    {
        var c = new List<Complex> { Complex.One };
        foreach (var r in roots)
        {
            var next = new Complex[c.Count + 1];
            for (int i = 0; i < c.Count; i++)
            {
                next[i + 1] += c[i];
                next[i] -= c[i] * r;
            }

            c = [.. next];
        }

        return [.. c.Select(z => z.Real)];
    }

    /// <summary>Controllable-form realisation of N(x)/D(x), D monic of degree 1 or 2, deg N &lt;= deg D.</summary>
    private static (Matrix<double> A, Vector<double> B, Vector<double> C, double D) Section(double[] den, double[] num)
    {
        int n = den.Length - 1;
        var full = new double[n + 1];
        for (int i = 0; i < num.Length; i++)
        {
            full[i] = num[i];
        }

        double dd = full[n];
        var a = Matrix<double>.Build.Dense(n, n);
        var b = Vector<double>.Build.Dense(n);
        var c = Vector<double>.Build.Dense(n);
        for (int i = 0; i + 1 < n; i++)
        {
            a[i, i + 1] = 1.0;
        }

        for (int i = 0; i < n; i++)
        {
            a[n - 1, i] = -den[i];
            c[i] = full[i] - (dd * den[i]);
        }

        b[n - 1] = 1.0;
        return (a, b, c, dd);
    }
}
