using System.Collections.Immutable;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Analysis;

/// <summary>A range of frequencies in Hz for a Bode plot or a margin search.</summary>
/// <param name="StartHz">Lowest frequency in Hz.</param>
/// <param name="StopHz">Highest frequency in Hz.</param>
/// <param name="Points">Number of points of a plotted response.</param>
public sealed record FrequencyGrid(double StartHz, double StopHz, int Points = 1000)
{
    /// <summary>
    /// An automatic range for functions whose interesting frequencies are unknown: from a thirtieth of the lowest
    /// non-zero pole or zero to thirty times the highest, limited to 1 mHz .. 10 GHz (our rule, no source).
    /// </summary>
    public static FrequencyGrid Automatic(IEnumerable<TransferFunction> functions, int points = 1000)
    {
        var hz = functions.SelectMany(t => t.Zeros.Concat(t.Poles)).Select(r => r.Magnitude / (2 * Math.PI)).Where(f => f > 0).ToList();
        if (hz.Count == 0)
        {
            return new FrequencyGrid(1e-2, 1e4, points);
        }

        double lo = Math.Clamp(hz.Min() / 30, 1e-3, 1e9), hi = Math.Clamp(hz.Max() * 30, 1e-2, 1e10);
        return new FrequencyGrid(lo, Math.Max(hi, lo * 100), points);
    }

    /// <summary>Logarithmically spaced frequencies from StartHz to StopHz, both included.</summary>
    public ImmutableArray<double> LogSpaced()
    {
        int n = Math.Max(Points, 2);
        double a = Math.Log(StartHz), b = Math.Log(StopHz);
        var f = new double[n];
        for (int i = 0; i < n; i++)
        {
            f[i] = Math.Exp(a + ((b - a) * i / (n - 1)));
        }

        f[0] = StartHz;
        f[n - 1] = StopHz;
        return [.. f];
    }

    /// <summary>
    /// Log-spaced points with extra points packed around every pole and zero inside the range
    /// (half the points evenly spaced, half near the roots, weighted by 1/Q).
    /// </summary>
    public ImmutableArray<double> Adaptive(IEnumerable<TransferFunction> functions)
    {
        int n = Math.Max(Points, 8);
        var corners = functions.SelectMany(t => t.Zeros.Concat(t.Poles))
            .Where(r => r.Imaginary >= 0)
            .Select(r => (Hz: r.Magnitude / (2 * Math.PI), Width: Math.Max(Math.Abs(r.Real) / r.Magnitude, 1e-4)))
            .Where(c => c.Hz > StartHz && c.Hz < StopHz)
            .ToList();
        if (corners.Count == 0)
        {
            return LogSpaced();
        }

        var points = new List<double>(n);
        int even = n / 2;
        points.AddRange(new FrequencyGrid(StartHz, StopHz, even).LogSpaced());
        int perCorner = Math.Max((n - even) / corners.Count, 2);
        foreach (var (hz, width) in corners)
        {
            // Points spread over +-3 bandwidths around the corner, bandwidth = relative damping (1/(2Q)).
            double span = Math.Min(3 * width, 0.5);
            for (int k = 0; k < perCorner; k++)
            {
                double u = -span + (2 * span * k / (perCorner - 1));
                double f = hz * Math.Exp(u);
                if (f > StartHz && f < StopHz)
                {
                    points.Add(f);
                }
            }
        }

        points.Sort();
        var dedup = new List<double>(points.Count);
        foreach (var f in points)
        {
            if (dedup.Count == 0 || f > dedup[^1] * (1 + 1e-9))
            {
                dedup.Add(f);
            }
        }

        return [.. dedup];
    }
}
