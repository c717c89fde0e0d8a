using System.Collections.Immutable;

namespace LoopShaper.Web.Model.Charts;

/// <summary>Turns core arrays into chart arrays. Plotly must never receive NaN or infinity: such points become gaps (null).</summary>
public static class ChartNumbers
{
    /// <summary>The x values, with non-finite points as gaps.</summary>
    public static List<object?> Xs(ImmutableArray<double> x, ImmutableArray<double> y) => Pair(x, y, true);

    /// <summary>The y values, with non-finite points as gaps.</summary>
    public static List<object?> Ys(ImmutableArray<double> x, ImmutableArray<double> y) => Pair(x, y, false);

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

    private static List<object?> Pair(ImmutableArray<double> x, ImmutableArray<double> y, bool takeX)
    {
        int n = Math.Min(x.Length, y.Length);
        var list = new List<object?>(n);
        for (int i = 0; i < n; i++)
        {
            bool ok = double.IsFinite(x[i]) && double.IsFinite(y[i]);
            list.Add(ok ? (takeX ? x[i] : y[i]) : null);
        }

        return list;
    }
}
