namespace LoopShaper.Core.Numerics;

/// <summary>
/// exp(A) by scaling and squaring with a diagonal Pade approximant of degree 6
/// (Golub and Van Loan, Matrix Computations, 3rd ed., algorithm 11.3.1), on small dense row-major arrays.
/// </summary>
public static class MatrixExponential
{
    /// <summary>exp(A) for a square n x n matrix given row-major.</summary>
    public static double[] Of(double[] a, int n)
    {
        const int q = 6;
        double norm = 0;
        for (int i = 0; i < n; i++)
        {
            double row = 0;
            for (int j = 0; j < n; j++)
            {
                row += Math.Abs(a[(i * n) + j]);
            }

            norm = Math.Max(norm, row);
        }

        int s = norm > 0 ? Math.Max(0, (int)Math.Floor(Math.Log2(norm)) + 2) : 0;
        double scale = Math.Pow(2, -s);
        var x = new double[n * n];
        for (int i = 0; i < x.Length; i++)
        {
            x[i] = a[i] * scale;
        }

        var num = Identity(n);
        var den = Identity(n);
        var power = Identity(n);
        var tmp = new double[n * n];
        double c = 1.0;
        for (int k = 1; k <= q; k++)
        {
            c = c * (q - k + 1) / (k * ((2 * q) - k + 1));
            Multiply(x, power, tmp, n);
            (power, tmp) = (tmp, power);
            double sc = k % 2 == 0 ? c : -c;
            for (int i = 0; i < num.Length; i++)
            {
                num[i] += c * power[i];
                den[i] += sc * power[i];
            }
        }

        var e = Solve(den, num, n);
        for (int k = 0; k < s; k++)
        {
            Multiply(e, e, tmp, n);
            (e, tmp) = (tmp, e);
        }

        return e;
    }

    private static double[] Identity(int n)
    {
        var m = new double[n * n];
        for (int i = 0; i < n; i++)
        {
            m[(i * n) + i] = 1.0;
        }

        return m;
    }

    private static void Multiply(double[] a, double[] b, double[] result, int n)
    {
        for (int i = 0; i < n; i++)
        {
            for (int j = 0; j < n; j++)
            {
                double acc = 0;
                for (int k = 0; k < n; k++)
                {
                    acc += a[(i * n) + k] * b[(k * n) + j];
                }

                result[(i * n) + j] = acc;
            }
        }
    }

    /// <summary>X = A^-1 B by Gaussian elimination with partial pivoting (A and B are overwritten).</summary>
    private static double[] Solve(double[] a, double[] b, int n)
    {
        for (int col = 0; col < n; col++)
        {
            int piv = col;
            for (int r = col + 1; r < n; r++)
            {
                if (Math.Abs(a[(r * n) + col]) > Math.Abs(a[(piv * n) + col]))
                {
                    piv = r;
                }
            }

            if (piv != col)
            {
                for (int j = 0; j < n; j++)
                {
                    (a[(col * n) + j], a[(piv * n) + j]) = (a[(piv * n) + j], a[(col * n) + j]);
                    (b[(col * n) + j], b[(piv * n) + j]) = (b[(piv * n) + j], b[(col * n) + j]);
                }
            }

            double d = a[(col * n) + col];
            for (int r = col + 1; r < n; r++)
            {
                double f = a[(r * n) + col] / d;
                if (f == 0)
                {
                    continue;
                }

                for (int j = col; j < n; j++)
                {
                    a[(r * n) + j] -= f * a[(col * n) + j];
                }

                for (int j = 0; j < n; j++)
                {
                    b[(r * n) + j] -= f * b[(col * n) + j];
                }
            }
        }

        for (int col = n - 1; col >= 0; col--)
        {
            double d = a[(col * n) + col];
            for (int j = 0; j < n; j++)
            {
                b[(col * n) + j] /= d;
            }

            for (int r = 0; r < col; r++)
            {
                double f = a[(r * n) + col];
                if (f == 0)
                {
                    continue;
                }

                for (int j = 0; j < n; j++)
                {
                    b[(r * n) + j] -= f * b[(col * n) + j];
                }
            }
        }

        return b;
    }
}
