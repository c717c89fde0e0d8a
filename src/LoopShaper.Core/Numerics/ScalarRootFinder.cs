namespace LoopShaper.Core.Numerics;

/// <summary>Bracketed scalar root finding and minimisation (Brent 1973, "Algorithms for Minimization without Derivatives", ch. 4 and 5).</summary>
public static class ScalarRootFinder
{
    /// <summary>
    /// Brent's method: a root of f in [a, b] where f(a) and f(b) differ in sign (or one is zero),
    /// to an absolute tolerance tol in x. Returns false when the bracket does not hold a sign change.
    /// </summary>
    public static bool TryBrent(Func<double, double> f, double a, double b, double tol, out double root)
    {
        double fa = f(a), fb = f(b);
        root = double.NaN;
        if (double.IsNaN(fa) || double.IsNaN(fb))
        {
            return false;
        }

        if (fa == 0.0)
        {
            root = a;
            return true;
        }

        if (fb == 0.0)
        {
            root = b;
            return true;
        }

        if (Math.Sign(fa) == Math.Sign(fb))
        {
            return false;
        }

        double c = a, fc = fa, d = b - a, e = d;
        for (int iter = 0; iter < 200; iter++)
        {
            if (Math.Sign(fb) == Math.Sign(fc))
            {
                c = a;
                fc = fa;
                d = b - a;
                e = d;
            }

            if (Math.Abs(fc) < Math.Abs(fb))
            {
                a = b;
                b = c;
                c = a;
                fa = fb;
                fb = fc;
                fc = fa;
            }

            double tol1 = (2.0 * 1e-16 * Math.Abs(b)) + (0.5 * tol);
            double xm = 0.5 * (c - b);
            if (Math.Abs(xm) <= tol1 || fb == 0.0)
            {
                root = b;
                return true;
            }

            if (Math.Abs(e) >= tol1 && Math.Abs(fa) > Math.Abs(fb))
            {
                double s = fb / fa, p, q;
                if (a == c)
                {
                    p = 2.0 * xm * s;
                    q = 1.0 - s;
                }
                else
                {
                    double qq = fa / fc, r = fb / fc;
                    p = s * ((2.0 * xm * qq * (qq - r)) - ((b - a) * (r - 1.0)));
                    q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
                }

                if (p > 0)
                {
                    q = -q;
                }

                p = Math.Abs(p);
                double min1 = (3.0 * xm * q) - Math.Abs(tol1 * q);
                double min2 = Math.Abs(e * q);
                if (2.0 * p < Math.Min(min1, min2))
                {
                    e = d;
                    d = p / q;
                }
                else
                {
                    d = xm;
                    e = d;
                }
            }
            else
            {
                d = xm;
                e = d;
            }

            a = b;
            fa = fb;
            b += Math.Abs(d) > tol1 ? d : Math.Sign(xm) * tol1;
            fb = f(b);
        }

        root = b;
        return true;
    }

    /// <summary>Golden-section search for the minimum of f on [a, b] to an absolute tolerance tol in x.</summary>
    public static double GoldenMinimum(Func<double, double> f, double a, double b, double tol)
    {
        const double invPhi = 0.6180339887498949;
        double x1 = b - (invPhi * (b - a)), x2 = a + (invPhi * (b - a));
        double f1 = f(x1), f2 = f(x2);
        for (int i = 0; i < 200 && Math.Abs(b - a) > tol; i++)
        {
            if (f1 < f2)
            {
                b = x2;
                x2 = x1;
                f2 = f1;
                x1 = b - (invPhi * (b - a));
                f1 = f(x1);
            }
            else
            {
                a = x1;
                x1 = x2;
                f1 = f2;
                x2 = a + (invPhi * (b - a));
                f2 = f(x2);
            }
        }

        return f1 < f2 ? x1 : x2;
    }
}
