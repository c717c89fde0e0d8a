using System.Collections.Immutable;

namespace LoopShaper.Core.Corners;

/// <summary>
/// The distribution of one figure over the samples that have it: mean, standard deviation, percentiles (linear
/// interpolation between order statistics, Hyndman and Fan 1996 definition 7, NumPy's default) and a histogram.
/// </summary>
/// <param name="Figure">"crossoverHz", "phaseMarginDeg", "upperGainMarginDb" or "lowerGainMarginDb".</param>
/// <param name="Count">Samples that have the figure.</param>
/// <param name="MissingCount">Samples without it (no crossing in range, or not analysed).</param>
/// <param name="Mean">Mean.</param>
/// <param name="StandardDeviation">Sample standard deviation (n - 1).</param>
/// <param name="Min">Smallest value.</param>
/// <param name="P1">1st percentile.</param>
/// <param name="P5">5th percentile.</param>
/// <param name="P50">Median.</param>
/// <param name="P95">95th percentile.</param>
/// <param name="P99">99th percentile.</param>
/// <param name="Max">Largest value.</param>
/// <param name="HistogramStart">Left edge of the first bin.</param>
/// <param name="HistogramBinWidth">Width of every bin.</param>
/// <param name="HistogramCounts">Samples per bin.</param>
public sealed record FigureDistribution(
    string Figure,
    int Count,
    int MissingCount,
    double Mean,
    double StandardDeviation,
    double Min,
    double P1,
    double P5,
    double P50,
    double P95,
    double P99,
    double Max,
    double HistogramStart,
    double HistogramBinWidth,
    ImmutableArray<int> HistogramCounts)
{
    /// <summary>The distribution of the values present; null when none is.</summary>
    public static FigureDistribution? Of(string figure, IReadOnlyList<double?> values, int bins)
    {
        var present = new List<double>(values.Count);
        foreach (var x in values)
        {
            if (x is double d && double.IsFinite(d))
            {
                present.Add(d);
            }
        }

        if (present.Count == 0)
        {
            return null;
        }

        var v = present.ToArray();
        Array.Sort(v);
        double sum = 0;
        foreach (double x in v)
        {
            sum += x;
        }

        double mean = sum / v.Length;
        double squares = 0;
        foreach (double x in v)
        {
            squares += (x - mean) * (x - mean);
        }

        double sd = v.Length > 1 ? Math.Sqrt(squares / (v.Length - 1)) : 0.0;
        bins = Math.Max(bins, 1);
        double lo = v[0], hi = v[^1];
        double width = hi > lo ? (hi - lo) / bins : 1.0;
        var counts = new int[bins];
        foreach (double x in v)
        {
            counts[Math.Min((int)((x - lo) / width), bins - 1)]++;
        }

        return new FigureDistribution(figure, v.Length, values.Count - v.Length, mean, sd, lo, Percentile(v, 1), Percentile(v, 5), Percentile(v, 50), Percentile(v, 95), Percentile(v, 99), hi, lo, width, [.. counts]);
    }

    /// <summary>The p-th percentile of sorted values: x[h] interpolated at h = (n - 1) p / 100 (Hyndman and Fan 1996, definition 7).</summary>
    public static double Percentile(IReadOnlyList<double> sorted, double p)
    {
        double h = (sorted.Count - 1) * p / 100.0;
        int i = (int)Math.Floor(h);
        return i + 1 < sorted.Count ? sorted[i] + ((h - i) * (sorted[i + 1] - sorted[i])) : sorted[^1];
    }
}
