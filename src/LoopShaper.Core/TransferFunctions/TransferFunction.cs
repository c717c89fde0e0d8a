using System.Collections.Immutable;
using System.Globalization;
using System.Numerics;
using LoopShaper.Core.Numerics;

namespace LoopShaper.Core.TransferFunctions;

/// <summary>
/// An immutable rational transfer function of s with real coefficients and an optional pure delay, held in
/// Bode (time-constant) form:
/// H(s) = K s^n prod(1 - s/z_i) / prod(1 - s/p_i) e^(-s Td),
/// where K is the low-frequency gain coefficient, n the number of zeros minus poles at the origin, and z_i, p_i
/// the non-zero zeros and poles in rad/s. Evaluating factor by factor keeps the result accurate when the
/// coefficients span many decades, and gives a continuous phase (shared/CONVENTIONS.md).
/// </summary>
public sealed class TransferFunction
{
    /// <summary>Roots closer to the origin than this fraction of the function's frequency scale are taken as exactly zero.</summary>
    internal const double OriginTolerance = 1e-10;

    /// <summary>Roots whose real part is below this fraction of their magnitude are taken as on the imaginary axis.</summary>
    internal const double AxisTolerance = 1e-12;

    private TransferFunction(double gain, int originOrder, ImmutableArray<Complex> zeros, ImmutableArray<Complex> poles, double delayS)
    {
        Gain = gain;
        OriginOrder = originOrder;
        Zeros = zeros;
        Poles = poles;
        DelayS = delayS;
        _plan = EvaluationPlan.Build(gain, originOrder, zeros, poles, delayS);
    }

    private readonly EvaluationPlan _plan;

    /// <summary>K: the coefficient of the low-frequency asymptote K s^n.</summary>
    public double Gain { get; }

    /// <summary>n: zeros at the origin minus poles at the origin (-1 for one integrator).</summary>
    public int OriginOrder { get; }

    /// <summary>Non-zero zeros in rad/s, complex ones in conjugate pairs.</summary>
    public ImmutableArray<Complex> Zeros { get; }

    /// <summary>Non-zero poles in rad/s, complex ones in conjugate pairs.</summary>
    public ImmutableArray<Complex> Poles { get; }

    /// <summary>Pure delay Td in seconds (zero for none).</summary>
    public double DelayS { get; }

    /// <summary>True when the function carries a pure delay.</summary>
    public bool HasDelay => DelayS != 0.0;

    /// <summary>Every zero, the ones at the origin included.</summary>
    public ImmutableArray<Complex> AllZeros => [.. Enumerable.Repeat(Complex.Zero, Math.Max(OriginOrder, 0)), .. Zeros];

    /// <summary>Every pole, the ones at the origin included.</summary>
    public ImmutableArray<Complex> AllPoles => [.. Enumerable.Repeat(Complex.Zero, Math.Max(-OriginOrder, 0)), .. Poles];

    /// <summary>Number of poles minus number of zeros.</summary>
    public int RelativeDegree => AllPoles.Length - AllZeros.Length;

    /// <summary>True when the function has no more zeros than poles.</summary>
    public bool IsProper => RelativeDegree >= 0;

    /// <summary>The DC gain H(0): K when there is no root at the origin, 0 with zeros there, null (unbounded) with poles there.</summary>
    public double? DcGain => OriginOrder switch
    {
        0 => Gain,
        > 0 => 0.0,
        _ => null,
    };

    /// <summary>A constant gain.</summary>
    public static TransferFunction Constant(double gain) => new(gain, 0, [], [], 0.0);

    /// <summary>A pure delay e^(-s Td).</summary>
    public static TransferFunction Delay(double delayS) => new(1.0, 0, [], [], delayS);

    /// <summary>
    /// From roots in rad/s: H(s) = K s^n prod(1 - s/z) / prod(1 - s/p) e^(-s Td). Roots at the origin in the lists are
    /// moved into n; complex roots must come in conjugate pairs.
    /// </summary>
    public static TransferFunction FromRoots(double gain, int originOrder, IEnumerable<Complex> zeros, IEnumerable<Complex> poles, double delayS = 0.0)
    {
        var z = zeros.ToList();
        var p = poles.ToList();
        double scale = FrequencyScale(z.Concat(p));
        int n = originOrder;
        var zc = Clean(z, scale, ref n, +1);
        var pc = Clean(p, scale, ref n, -1);
        if (gain == 0.0)
        {
            return new TransferFunction(0.0, 0, [], [], 0.0);
        }

        return new TransferFunction(gain, n, zc, pc, delayS);
    }

    /// <summary>
    /// From factors in Hz: H(s) = K s^n prod(zero factors) / prod(pole factors) e^(-s Td), each factor normalised to 1 at DC.
    /// </summary>
    /// <param name="gain">K, the low-frequency gain coefficient (for n = -1: K = w_i in rad/s, the integrator's unity-gain angular frequency).</param>
    /// <param name="originOrder">Zeros at the origin minus poles at the origin.</param>
    /// <param name="zeros">Zero factors.</param>
    /// <param name="poles">Pole factors.</param>
    /// <param name="delayS">Pure delay in seconds.</param>
    public static TransferFunction FromFactors(double gain, int originOrder, IEnumerable<Factor> zeros, IEnumerable<Factor> poles, double delayS = 0.0)
        => FromRoots(gain, originOrder, zeros.SelectMany(f => f.Roots()), poles.SelectMany(f => f.Roots()), delayS);

    /// <summary>
    /// From polynomial coefficients in descending powers of s, as Octave's tf and SciPy's lti take them:
    /// H(s) = (b0 s^m + ... + bm) / (a0 s^k + ... + ak) e^(-s Td).
    /// </summary>
    public static TransferFunction FromCoefficients(IReadOnlyList<double> numeratorDescending, IReadOnlyList<double> denominatorDescending, double delayS = 0.0)
    {
        var num = new Polynomial(numeratorDescending.Reverse());
        var den = new Polynomial(denominatorDescending.Reverse());
        if (den.IsZero)
        {
            throw new ArgumentException("The denominator must not be zero.", nameof(denominatorDescending));
        }

        if (num.IsZero)
        {
            return Constant(0.0);
        }

        // Balance the variable: s = w p with w the geometric mean of the root magnitudes of both polynomials.
        double w = Math.Sqrt(BalanceScale(num) * BalanceScale(den));
        return FromScaledPolynomials(1.0, Rescale(num, w), Rescale(den, w), w, delayS);
    }

    /// <summary>Evaluates H(j omega) at an angular frequency in rad/s.</summary>
    public Complex Evaluate(double omega) => Complex.FromPolarCoordinates(Math.Exp(LogMagnitude(omega)), PhaseRad(omega));

    /// <summary>Evaluates H(j 2 pi f) at a frequency in Hz.</summary>
    public Complex EvaluateHz(double frequencyHz) => Evaluate(2.0 * Math.PI * frequencyHz);

    /// <summary>Evaluates H at a complex s (no phase continuity implied).</summary>
    public Complex EvaluateAt(Complex s)
    {
        Complex h = Gain * Complex.Pow(s, OriginOrder);
        foreach (var z in Zeros)
        {
            h *= 1.0 - (s / z);
        }

        foreach (var p in Poles)
        {
            h /= 1.0 - (s / p);
        }

        return DelayS == 0.0 ? h : h * Complex.Exp(-s * DelayS);
    }

    /// <summary>Natural logarithm of |H(j omega)|, summed factor by factor.</summary>
    public double LogMagnitude(double omega) => _plan.LogMagnitude(omega);

    /// <summary>Natural logarithm of |H(j omega)| and the continuous phase in radians, in one pass over the factors.</summary>
    public void LogMagnitudeAndPhase(double omega, out double logMagnitude, out double phaseRad) => _plan.Evaluate(omega, out logMagnitude, out phaseRad);

    /// <summary>|H(j 2 pi f)| in dB (20 log10).</summary>
    public double MagnitudeDb(double frequencyHz) => 20.0 / Math.Log(10.0) * LogMagnitude(2.0 * Math.PI * frequencyHz);

    /// <summary>
    /// Continuous phase of H(j omega) in radians: the sum of the factor angles, starting at n pi/2 for the roots at the origin
    /// (and -pi for a negative K); a delay adds -omega Td. A root on the imaginary axis makes the phase jump by pi
    /// (+pi for zeros, -pi for poles), the limit from the left half plane.
    /// </summary>
    public double PhaseRad(double omega) => _plan.Phase(omega);

    /// <summary>Continuous phase of H(j 2 pi f) in degrees.</summary>
    public double PhaseDeg(double frequencyHz) => PhaseRad(2.0 * Math.PI * frequencyHz) * 180.0 / Math.PI;

    /// <summary>Frequencies in rad/s of the roots that sit on the imaginary axis (where the phase jumps).</summary>
    public IEnumerable<double> AxisRootFrequencies()
        => Zeros.Concat(Poles).Where(r => r.Real == 0.0 && r.Imaginary > 0).Select(r => r.Imaginary);

    /// <summary>The product H1 H2 (series connection): roots and gains combine exactly, delays add.</summary>
    public TransferFunction Multiply(TransferFunction other)
        => FromRoots(Gain * other.Gain, OriginOrder + other.OriginOrder, Zeros.Concat(other.Zeros), Poles.Concat(other.Poles), DelayS + other.DelayS);

    /// <summary>The function times a constant.</summary>
    public TransferFunction Scale(double k) => k == 0.0 ? Constant(0.0) : new(Gain * k, OriginOrder, Zeros, Poles, DelayS);

    /// <summary>1 / H: zeros and poles swap; not defined with a delay.</summary>
    public TransferFunction Invert()
    {
        if (HasDelay)
        {
            throw new InvalidOperationException("A function with a pure delay cannot be inverted.");
        }

        return new TransferFunction(1.0 / Gain, -OriginOrder, Poles, Zeros, 0.0);
    }

    /// <summary>H1 + H2 (parallel connection). Both must carry the same delay.</summary>
    public TransferFunction Add(TransferFunction other)
    {
        if (DelayS != other.DelayS)
        {
            throw new InvalidOperationException("Functions with different pure delays cannot be added exactly; replace the delays by Pade approximations first.");
        }

        if (Gain == 0.0)
        {
            return other;
        }

        if (other.Gain == 0.0)
        {
            return this;
        }

        double w = FrequencyScale(Zeros.Concat(Poles).Concat(other.Zeros).Concat(other.Poles));
        var (k1, n1, d1) = ScaledParts(w);
        var (k2, n2, d2) = other.ScaledParts(w);
        var num = n1.Multiply(d2).Scale(k1).Add(n2.Multiply(d1).Scale(k2));
        var den = d1.Multiply(d2);
        return FromScaledPolynomials(1.0, num, den, w, DelayS);
    }

    /// <summary>
    /// Negative feedback G / (1 + G H) with G = this and H the feedback path (shared/CONVENTIONS.md: the loop gain is G H).
    /// Delays must be replaced by Pade approximations first (see <see cref="WithPadeDelay"/>).
    /// </summary>
    public TransferFunction Feedback(TransferFunction feedbackPath)
    {
        if (HasDelay || feedbackPath.HasDelay)
        {
            throw new InvalidOperationException("Closing a loop around a pure delay needs a Pade approximation of the delay first.");
        }

        double w = FrequencyScale(Zeros.Concat(Poles).Concat(feedbackPath.Zeros).Concat(feedbackPath.Poles));
        var (kg, ng, dg) = ScaledParts(w);
        var (kh, nh, dh) = feedbackPath.ScaledParts(w);
        var num = ng.Multiply(dh).Scale(kg);
        var den = dg.Multiply(dh).Add(ng.Multiply(nh).Scale(kg * kh));
        return FromScaledPolynomials(1.0, num, den, w, 0.0);
    }

    /// <summary>The roots of 1 + H(s) = 0 in rad/s (the closed-loop poles of a unity feedback loop with loop gain H, delay-free).</summary>
    public ImmutableArray<Complex> ClosedLoopPoles()
    {
        if (HasDelay)
        {
            throw new InvalidOperationException("Closed-loop poles of a loop with a pure delay need a Pade approximation of the delay first.");
        }

        double w = FrequencyScale(Zeros.Concat(Poles));
        var (k, n, d) = ScaledParts(w);
        var roots = d.Add(n.Scale(k)).Roots();
        return [.. roots.Select(r => r * w)];
    }

    /// <summary>This function with its delay replaced by a Pade approximation of the given order (unchanged without a delay).</summary>
    public TransferFunction WithPadeDelay(int order)
        => HasDelay ? new TransferFunction(Gain, OriginOrder, Zeros, Poles, 0.0).Multiply(PadeApproximation.Of(DelayS, order)) : this;

    /// <summary>
    /// This function with pole-zero pairs that coincide to a relative tolerance cancelled (the hidden modes they
    /// stand for are stable ones left by closing a loop around a plant; unstable pairs are kept).
    /// </summary>
    public TransferFunction Minimal(double relativeTolerance = 1e-7)
    {
        var zeros = Zeros.ToList();
        var poles = Poles.ToList();
        bool changed = false;
        for (int i = zeros.Count - 1; i >= 0; i--)
        {
            var z = zeros[i];
            int j = poles.FindIndex(p => Complex.Abs(p - z) <= relativeTolerance * Complex.Abs(p) && p.Real < 0);
            if (j >= 0)
            {
                zeros.RemoveAt(i);
                poles.RemoveAt(j);
                changed = true;
            }
        }

        return changed ? new TransferFunction(Gain, OriginOrder, [.. zeros], [.. poles], DelayS) : this;
    }

    /// <summary>This function without its pure delay.</summary>
    public TransferFunction WithoutDelay() => new(Gain, OriginOrder, Zeros, Poles, 0.0);

    /// <summary>This function with a pure delay added.</summary>
    public TransferFunction WithDelay(double delayS) => new(Gain, OriginOrder, Zeros, Poles, DelayS + delayS);

    /// <summary>
    /// Numerator and denominator coefficients in descending powers of s (for export to other tools). For functions whose
    /// roots span many decades these coefficients are ill-conditioned; the factored form is the accurate one.
    /// </summary>
    public (double[] NumeratorDescending, double[] DenominatorDescending) ToCoefficients()
    {
        // K s^n prod(1 - s/z) / prod(1 - s/p)
        var num = Polynomial.FromNormalizedRoots(Zeros).Scale(Gain).ShiftUp(Math.Max(OriginOrder, 0));
        var den = Polynomial.FromNormalizedRoots(Poles).ShiftUp(Math.Max(-OriginOrder, 0));
        return ([.. num.Coefficients.Reverse()], [.. den.Coefficients.Reverse()]);
    }

    /// <summary>A short description in factored form, frequencies in Hz.</summary>
    public override string ToString()
    {
        var inv = CultureInfo.InvariantCulture;
        static string Roots(IEnumerable<Complex> rs) => string.Join(", ", rs.Select(r => r.Imaginary == 0
            ? (r.Real / (2 * Math.PI)).ToString("G4", CultureInfo.InvariantCulture)
            : string.Create(CultureInfo.InvariantCulture, $"{r.Real / (2 * Math.PI):G4}{(r.Imaginary >= 0 ? "+" : "-")}j{Math.Abs(r.Imaginary) / (2 * Math.PI):G4}")));
        return string.Create(inv, $"K={Gain:G6}, s^{OriginOrder}, zeros[Hz]=({Roots(Zeros)}), poles[Hz]=({Roots(Poles)}), Td={DelayS:G4}s");
    }

    /// <summary>Geometric mean of the magnitudes of the non-zero roots; 1 when there are none.</summary>
    internal static double FrequencyScale(IEnumerable<Complex> roots)
    {
        double sum = 0;
        int count = 0;
        foreach (var r in roots)
        {
            double m = Complex.Abs(r);
            if (m > 0 && double.IsFinite(m))
            {
                sum += Math.Log(m);
                count++;
            }
        }

        return count == 0 ? 1.0 : Math.Exp(sum / count);
    }

    /// <summary>
    /// Splits H into k N(x) / D(x) with s = w x, N and D normalised to 1 at x = 0 apart from powers of x for the
    /// origin roots.
    /// </summary>
    internal (double K, Polynomial Num, Polynomial Den) ScaledParts(double w)
    {
        var num = Polynomial.FromNormalizedRoots(Zeros.Select(z => z / w)).ShiftUp(Math.Max(OriginOrder, 0));
        var den = Polynomial.FromNormalizedRoots(Poles.Select(p => p / w)).ShiftUp(Math.Max(-OriginOrder, 0));
        return (Gain * Math.Pow(w, OriginOrder), num, den);
    }

    /// <summary>H(s) = k N(s/w) / D(s/w) e^(-s Td), from polynomials in the scaled variable x = s / w.</summary>
    internal static TransferFunction FromScaledPolynomials(double k, Polynomial num, Polynomial den, double w, double delayS)
    {
        if (num.IsZero || k == 0.0)
        {
            return Constant(0.0);
        }

        // Roots within round-off of the origin count as exactly there, and the gain comes from the coefficient of the
        // matching power, so that a pole at 1e-17 does not turn into a gain 1e17 times too large (MARGIN-CASES 6).
        var zr = num.Roots();
        var pr = den.Roots();
        double scale = FrequencyScale(zr.Concat(pr));
        bool AtOrigin(Complex r) => Complex.Abs(r) <= OriginTolerance * scale;
        int a = zr.Count(AtOrigin), b = pr.Count(AtOrigin);
        double gain = k * num.Coefficients[a] / den.Coefficients[b] * Math.Pow(w, b - a);
        var zeros = zr.Where(r => !AtOrigin(r)).Select(r => r * w);
        var poles = pr.Where(r => !AtOrigin(r)).Select(r => r * w);
        return FromRoots(gain, a - b, zeros, poles, delayS);
    }

    private static double BalanceScale(Polynomial p)
    {
        int low = p.LowestOrder, high = p.Degree;
        if (high == low)
        {
            return 1.0;
        }

        double ratio = Math.Abs(p.Coefficients[low] / p.Coefficients[high]);
        return Math.Pow(ratio, 1.0 / (high - low));
    }

    private static Polynomial Rescale(Polynomial p, double w)
    {
        // p(w x): coefficient k times w^k.
        // In logarithms, so that c w^k stays finite when c and w^k alone would not (1e300 with w = 1e154).
        return new Polynomial(p.Coefficients.Select((c, i) => c == 0.0 ? 0.0 : Math.Sign(c) * Math.Exp(Math.Log(Math.Abs(c)) + (i * Math.Log(w)))));
    }

    /// <summary>Moves near-origin roots into n, snaps near-axis roots onto the axis and pairs complex roots into exact conjugates.</summary>
    private static ImmutableArray<Complex> Clean(List<Complex> roots, double scale, ref int originOrder, int sign)
    {
        var kept = new List<Complex>(roots.Count);
        foreach (var r0 in roots)
        {
            if (!double.IsFinite(r0.Real) || !double.IsFinite(r0.Imaginary))
            {
                throw new ArgumentException("Roots must be finite.", nameof(roots));
            }

            if (Complex.Abs(r0) <= OriginTolerance * scale)
            {
                originOrder += sign;
                continue;
            }

            var r = r0;
            if (Math.Abs(r.Real) <= AxisTolerance * Complex.Abs(r))
            {
                r = new Complex(0.0, r.Imaginary);
            }

            if (Math.Abs(r.Imaginary) <= AxisTolerance * Complex.Abs(r))
            {
                r = new Complex(r.Real, 0.0);
            }

            kept.Add(r);
        }

        // Pair complex roots: each root with positive imaginary part takes its nearest partner below the axis.
        var result = new List<Complex>(kept.Count);
        var upper = kept.Where(r => r.Imaginary > 0).OrderBy(r => r.Imaginary).ToList();
        var lower = kept.Where(r => r.Imaginary < 0).ToList();
        result.AddRange(kept.Where(r => r.Imaginary == 0).OrderBy(r => Math.Abs(r.Real)));
        foreach (var u in upper)
        {
            if (lower.Count == 0)
            {
                throw new ArgumentException("Complex roots must come in conjugate pairs.", nameof(roots));
            }

            var partner = lower.MinBy(l => Complex.Abs(l - Complex.Conjugate(u)));
            lower.Remove(partner);
            var avg = new Complex(0.5 * (u.Real + partner.Real), 0.5 * (u.Imaginary - partner.Imaginary));
            result.Add(avg);
            result.Add(Complex.Conjugate(avg));
        }

        if (lower.Count > 0)
        {
            throw new ArgumentException("Complex roots must come in conjugate pairs.", nameof(roots));
        }

        return [.. result];
    }
}
