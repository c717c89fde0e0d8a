using System.Collections.Immutable;
using System.Numerics;

namespace LoopShaper.Core.Numerics;

/// <summary>
/// An immutable polynomial with real coefficients, stored ascending by exponent:
/// p(x) = c[0] + c[1] x + ... + c[n] x^n (the same order as MathNet's FindRoots.Polynomial).
/// </summary>
public sealed class Polynomial
{
    /// <summary>Coefficients ascending by exponent; the last one is non-zero unless the polynomial is zero.</summary>
    public ImmutableArray<double> Coefficients { get; }

    /// <summary>Creates a polynomial from coefficients ascending by exponent; trailing zeros are dropped.</summary>
    public Polynomial(IEnumerable<double> ascending)
    {
        var list = ascending.ToList();
        int n = list.Count;
        while (n > 1 && list[n - 1] == 0.0)
        {
            n--;
        }

        Coefficients = n == 0 ? [0.0] : [.. list.Take(n)];
    }

    /// <summary>The constant polynomial 1.</summary>
    public static Polynomial One { get; } = new([1.0]);

    /// <summary>Degree; the zero polynomial has degree 0.</summary>
    public int Degree => Coefficients.Length - 1;

    /// <summary>True when every coefficient is zero.</summary>
    public bool IsZero => Coefficients.Length == 1 && Coefficients[0] == 0.0;

    /// <summary>Builds prod(1 - x / r) over the roots; complex roots must come in conjugate pairs.</summary>
    public static Polynomial FromNormalizedRoots(IEnumerable<Complex> roots)
    {
        var c = new List<Complex> { Complex.One };
        foreach (var r in roots)
        {
            var inv = -1.0 / r;
            var next = new Complex[c.Count + 1];
            for (int i = 0; i < c.Count; i++)
            {
                next[i] += c[i];
                next[i + 1] += c[i] * inv;
            }

            c = [.. next];
        }

        return new Polynomial(c.Select(z => z.Real));
    }

    /// <summary>Evaluates the polynomial at x by Horner's rule.</summary>
    public Complex Evaluate(Complex x)
    {
        Complex acc = Complex.Zero;
        for (int i = Coefficients.Length - 1; i >= 0; i--)
        {
            acc = (acc * x) + Coefficients[i];
        }

        return acc;
    }

    /// <summary>Evaluates the polynomial at a real x by Horner's rule.</summary>
    public double Evaluate(double x)
    {
        double acc = 0.0;
        for (int i = Coefficients.Length - 1; i >= 0; i--)
        {
            acc = (acc * x) + Coefficients[i];
        }

        return acc;
    }

    /// <summary>Sum of two polynomials.</summary>
    public Polynomial Add(Polynomial other)
    {
        int n = Math.Max(Coefficients.Length, other.Coefficients.Length);
        var c = new double[n];
        for (int i = 0; i < Coefficients.Length; i++)
        {
            c[i] += Coefficients[i];
        }

        for (int i = 0; i < other.Coefficients.Length; i++)
        {
            c[i] += other.Coefficients[i];
        }

        return new Polynomial(c);
    }

    /// <summary>Product of two polynomials.</summary>
    public Polynomial Multiply(Polynomial other)
    {
        var c = new double[Coefficients.Length + other.Coefficients.Length - 1];
        for (int i = 0; i < Coefficients.Length; i++)
        {
            for (int j = 0; j < other.Coefficients.Length; j++)
            {
                c[i + j] += Coefficients[i] * other.Coefficients[j];
            }
        }

        return new Polynomial(c);
    }

    /// <summary>The polynomial times a constant.</summary>
    public Polynomial Scale(double k) => new(Coefficients.Select(c => c * k));

    /// <summary>The polynomial times x^k.</summary>
    public Polynomial ShiftUp(int k) => k <= 0 ? this : new Polynomial(Enumerable.Repeat(0.0, k).Concat(Coefficients));

    /// <summary>Number of lowest-order coefficients that are exactly zero (the multiplicity of the root at x = 0).</summary>
    public int LowestOrder
    {
        get
        {
            int k = 0;
            while (k < Coefficients.Length - 1 && Coefficients[k] == 0.0)
            {
                k++;
            }

            return k;
        }
    }

    /// <summary>
    /// Roots of the polynomial (eigenvalues of the companion matrix, MathNet FindRoots.Polynomial),
    /// after dividing out the roots at x = 0, which are returned as exact zeros. The variable is first scaled,
    /// x = sigma y with sigma = |c_low / c_high|^(1/n) (the geometric mean of the root magnitudes), and the coefficients
    /// normalised, so that roots spread over many decades keep their accuracy (the unscaled companion matrix loses
    /// them); each root is then polished by Newton steps on the scaled polynomial while they reduce |p(y)|.
    /// </summary>
    public ImmutableArray<Complex> Roots()
    {
        int low = LowestOrder;
        var rest = Coefficients.Skip(low).ToArray();
        var roots = new List<Complex>(Degree);
        roots.AddRange(Enumerable.Repeat(Complex.Zero, low));
        if (rest.Length == 2)
        {
            roots.Add(new Complex(-rest[0] / rest[1], 0));
        }
        else if (rest.Length > 2)
        {
            int n = rest.Length - 1;
            double sigma = Math.Pow(Math.Abs(rest[0] / rest[n]), 1.0 / n);
            if (!(sigma > 0) || !double.IsFinite(sigma))
            {
                sigma = 1.0;
            }

            var y = new double[rest.Length];
            double scale = 1.0, max = 0.0;
            for (int k = 0; k < y.Length; k++)
            {
                y[k] = rest[k] * scale;
                max = Math.Max(max, Math.Abs(y[k]));
                scale *= sigma;
            }

            for (int k = 0; k < y.Length; k++)
            {
                y[k] /= max;
            }

            var scaled = new Polynomial(y);
            var derivative = new Polynomial(y.Skip(1).Select((c, k) => c * (k + 1)));
            foreach (var r0 in MathNet.Numerics.FindRoots.Polynomial(y))
            {
                roots.Add(Polish(scaled, derivative, r0) * sigma);
            }
        }

        return [.. roots];
    }

    private static Complex Polish(Polynomial p, Polynomial dp, Complex root)
    {
        var value = p.Evaluate(root);
        for (int i = 0; i < 3; i++)
        {
            var slope = dp.Evaluate(root);
            if (slope == Complex.Zero)
            {
                break;
            }

            var next = root - (value / slope);
            // Keep a real root real: conjugate pairing happens later on the exact imaginary parts.
            if (root.Imaginary == 0)
            {
                next = new Complex(next.Real, 0);
            }

            var nextValue = p.Evaluate(next);
            if (!(Complex.Abs(nextValue) < Complex.Abs(value)))
            {
                break;
            }

            (root, value) = (next, nextValue);
        }

        return root;
    }
}
