using System.Collections.Immutable;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Drops the points of a drawn curve that a straight segment between their neighbours reproduces to within a vertical
/// tolerance (Ramer-Douglas-Peucker with the vertical distance, Douglas and Peucker, Canadian Cartographer 10(2),
/// 1973). The kept points are a subset of the core's points, so every drawn vertex is a computed value; the first,
/// last, largest and smallest points and the points beside every gap (a non-finite value) are always kept. The x
/// interpolation is linear in log10(x) for a logarithmic axis. Display only: no figure is read from the result.
/// </summary>
public static class CurveSimplifier
{
    /// <summary>Indices of the points to draw, ascending; non-finite points are kept as the gaps they are.</summary>
    /// <param name="x">Abscissae, ascending.</param>
    /// <param name="y">Ordinates.</param>
    /// <param name="tolerance">Largest vertical distance of a dropped point from the drawn segment, in y's unit.</param>
    /// <param name="logX">True when the x axis is logarithmic (x must then be positive).</param>
    public static List<int> Keep(ImmutableArray<double> x, ImmutableArray<double> y, double tolerance, bool logX)
    {
        int n = Math.Min(x.Length, y.Length);
        var keep = new bool[n];
        var u = new double[n];
        for (int i = 0; i < n; i++)
        {
            u[i] = logX ? Math.Log10(x[i]) : x[i];
        }

        bool Finite(int i) => double.IsFinite(u[i]) && double.IsFinite(y[i]);

        int start = 0;
        while (start < n)
        {
            if (!Finite(start))
            {
                keep[start] = true; // a gap: Plotly draws null as a break in the line
                start++;
                continue;
            }

            int end = start;
            while (end + 1 < n && Finite(end + 1))
            {
                end++;
            }

            SimplifyRun(u, y, start, end, tolerance, keep);
            start = end + 1;
        }

        var result = new List<int>();
        for (int i = 0; i < n; i++)
        {
            if (keep[i])
            {
                result.Add(i);
            }
        }

        return result;
    }

    private static void SimplifyRun(double[] u, ImmutableArray<double> y, int first, int last, double tolerance, bool[] keep)
    {
        int iMin = first, iMax = first;
        for (int i = first; i <= last; i++)
        {
            if (y[i] < y[iMin])
            {
                iMin = i;
            }

            if (y[i] > y[iMax])
            {
                iMax = i;
            }
        }

        keep[first] = keep[last] = keep[iMin] = keep[iMax] = true;

        // Split at every point kept so far, then refine each span until no dropped point is farther than the tolerance.
        var spans = new Stack<(int A, int B)>();
        int a = first;
        for (int i = first + 1; i <= last; i++)
        {
            if (keep[i])
            {
                spans.Push((a, i));
                a = i;
            }
        }

        while (spans.Count > 0)
        {
            var (lo, hi) = spans.Pop();
            if (hi - lo < 2)
            {
                continue;
            }

            double du = u[hi] - u[lo];
            int worst = -1;
            double worstDistance = tolerance;
            for (int i = lo + 1; i < hi; i++)
            {
                double t = du != 0 ? (u[i] - u[lo]) / du : 0.5;
                double d = Math.Abs(y[i] - (y[lo] + (t * (y[hi] - y[lo]))));
                if (d > worstDistance)
                {
                    worstDistance = d;
                    worst = i;
                }
            }

            if (worst >= 0)
            {
                keep[worst] = true;
                spans.Push((lo, worst));
                spans.Push((worst, hi));
            }
        }
    }
}
