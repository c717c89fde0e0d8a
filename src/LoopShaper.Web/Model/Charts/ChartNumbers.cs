using System.Collections.Immutable;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Turns core arrays into chart arrays. Plotly must never receive NaN or infinity: such points become gaps (null).
/// Values are rounded for display only (a chart cannot show more than about five digits), which keeps each redraw's
/// payload small; every figure the engineer reads as a number comes from the core unrounded.
/// </summary>
public static class ChartNumbers
{
    /// <summary>Both coordinates of a series: non-finite points as gaps, x to six significant digits, y to <paramref name="yQuantum"/>.</summary>
    public static (List<object?> X, List<object?> Y) Series(ImmutableArray<double> x, ImmutableArray<double> y, double yQuantum)
    {
        int n = Math.Min(x.Length, y.Length);
        var xs = new List<object?>(n);
        var ys = new List<object?>(n);
        for (int i = 0; i < n; i++)
        {
            bool ok = double.IsFinite(x[i]) && double.IsFinite(y[i]);
            xs.Add(ok ? Significant(x[i], 6) : null);
            ys.Add(ok ? Quantize(y[i], yQuantum) : null);
        }

        return (xs, ys);
    }

    /// <summary>
    /// A long time series thinned to at most <paramref name="maxPoints"/> by keeping the smallest and largest value of
    /// each bucket (so peaks survive), y rounded to a hundred-thousandth of its largest magnitude.
    /// </summary>
    public static (List<object?> X, List<object?> Y) Thinned(ImmutableArray<double> x, ImmutableArray<double> y, int maxPoints, double? yQuantum = null)
    {
        int n = Math.Min(x.Length, y.Length);
        var (lo, hi) = Extent(y, 0, 0);
        double quantum = yQuantum ?? Math.Max(Math.Max(Math.Abs(lo), Math.Abs(hi)), 1e-300) * 1e-5;
        if (n <= maxPoints)
        {
            return Series(x, y, quantum);
        }

        int buckets = Math.Max(maxPoints / 2, 1);
        var keep = new List<int>(maxPoints + 2);
        for (int b = 0; b < buckets; b++)
        {
            int start = (int)((long)b * n / buckets), end = (int)((long)(b + 1) * n / buckets);
            int iMin = start, iMax = start;
            for (int i = start; i < end; i++)
            {
                if (!double.IsFinite(y[i]))
                {
                    continue;
                }

                if (!double.IsFinite(y[iMin]) || y[i] < y[iMin])
                {
                    iMin = i;
                }

                if (!double.IsFinite(y[iMax]) || y[i] > y[iMax])
                {
                    iMax = i;
                }
            }

            keep.Add(Math.Min(iMin, iMax));
            if (iMin != iMax)
            {
                keep.Add(Math.Max(iMin, iMax));
            }
        }

        if (keep[^1] != n - 1)
        {
            keep.Add(n - 1);
        }

        return Series([.. keep.Select(i => x[i])], [.. keep.Select(i => y[i])], quantum);
    }

    /// <summary>
    /// A curve with the points a straight segment reproduces to within <paramref name="tolerance"/> dropped
    /// (<see cref="CurveSimplifier"/>), thinned by <see cref="Thinned"/> if still longer than <paramref name="maxPoints"/>.
    /// </summary>
    public static (List<object?> X, List<object?> Y) Simplified(ImmutableArray<double> x, ImmutableArray<double> y, double tolerance, bool logX, int maxPoints, double? yQuantum = null)
    {
        var keep = CurveSimplifier.Keep(x, y, tolerance, logX);
        if (keep.Count > maxPoints)
        {
            return Thinned(x, y, maxPoints, yQuantum);
        }

        var (lo, hi) = Extent(y, 0, 0);
        double quantum = yQuantum ?? Math.Max(Math.Max(Math.Abs(lo), Math.Abs(hi)), 1e-300) * 1e-5;
        return Series([.. keep.Select(i => x[i])], [.. keep.Select(i => y[i])], quantum);
    }

    /// <summary>The vertical tolerance for a time series drawn with <see cref="Simplified"/>: 2e-4 of its span.</summary>
    public static double TimeTolerance(ImmutableArray<double> y)
    {
        var (lo, hi) = Extent(y, 0, 0);
        return Math.Max(hi - lo, 1e-300) * 2e-4;
    }

    /// <summary>True for a number Plotly can draw.</summary>
    public static bool IsDrawable(double? v) => v is double d && double.IsFinite(d);

    /// <summary>Limits of the finite values, or the fallback when there are none.</summary>
    public static (double Min, double Max) Extent(IEnumerable<double> values, double fallbackMin, double fallbackMax)
    {
        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        foreach (var v in values)
        {
            if (double.IsFinite(v))
            {
                min = Math.Min(min, v);
                max = Math.Max(max, v);
            }
        }

        return min <= max ? (min, max) : (fallbackMin, fallbackMax);
    }

    /// <summary>A value rounded to <paramref name="digits"/> significant digits (display only).</summary>
    public static double Significant(double v, int digits)
    {
        if (v == 0 || !double.IsFinite(v))
        {
            return v;
        }

        int e = digits - 1 - (int)Math.Floor(Math.Log10(Math.Abs(v)));
        if (e < -300 || e > 300)
        {
            return v;
        }

        return e >= 0 ? Math.Round(v * Math.Pow(10, e)) / Math.Pow(10, e) : Math.Round(v / Math.Pow(10, -e)) * Math.Pow(10, -e);
    }

    /// <summary>Rounds to the power of ten at or below the quantum, dividing last so that the printed form stays short.</summary>
    private static double Quantize(double v, double quantum)
    {
        if (!(quantum > 0))
        {
            return v;
        }

        int k = (int)Math.Ceiling(-Math.Log10(quantum));
        if (k > 300 || k < -300)
        {
            return v;
        }

        return k >= 0 ? Math.Round(v * Math.Pow(10, k)) / Math.Pow(10, k) : Math.Round(v / Math.Pow(10, -k)) * Math.Pow(10, -k);
    }
}
