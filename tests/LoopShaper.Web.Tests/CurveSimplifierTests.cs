using System.Collections.Immutable;
using LoopShaper.Web.Model.Charts;

namespace LoopShaper.Web.Tests;

/// <summary>The drawn curve after dropping points: a subset of the computed points that stays within the tolerance.</summary>
public sealed class CurveSimplifierTests
{
    [Fact]
    public void A_straight_line_keeps_only_its_ends()
    {
        var x = ImmutableArray.CreateRange(Enumerable.Range(0, 200).Select(i => (double)i));
        var y = ImmutableArray.CreateRange(x.Select(v => 3 - (0.5 * v)));
        Assert.Equal([0, 199], CurveSimplifier.Keep(x, y, 1e-9, logX: false));
    }

    [Fact]
    public void A_first_order_pole_in_log_frequency_stays_within_the_tolerance_with_far_fewer_points()
    {
        // |1/(1 + j f/fp)| in dB on 1000 log-spaced points, 10 Hz to 10 MHz: the two asymptotes are straight in log f,
        // so only the corner region needs points.
        const double fp = 10e3;
        var x = ImmutableArray.CreateRange(Enumerable.Range(0, 1000).Select(i => 10 * Math.Pow(10, 6.0 * i / 999)));
        var y = ImmutableArray.CreateRange(x.Select(f => -10 * Math.Log10(1 + ((f / fp) * (f / fp)))));
        var keep = CurveSimplifier.Keep(x, y, 0.05, logX: true);

        Assert.InRange(keep.Count, 5, 100);
        Assert.Equal(0, keep[0]);
        Assert.Equal(999, keep[^1]);
        for (int k = 0; k + 1 < keep.Count; k++)
        {
            int a = keep[k], b = keep[k + 1];
            for (int i = a + 1; i < b; i++)
            {
                double t = (Math.Log10(x[i]) - Math.Log10(x[a])) / (Math.Log10(x[b]) - Math.Log10(x[a]));
                double drawn = y[a] + (t * (y[b] - y[a]));
                Assert.True(Math.Abs(drawn - y[i]) <= 0.05, $"point {i} is {Math.Abs(drawn - y[i])} dB from the drawn segment");
            }
        }
    }

    [Fact]
    public void A_resonance_peak_and_the_points_beside_a_gap_survive()
    {
        // A narrow peak one sample wide and a NaN: the peak is the largest value, the NaN a break in the line.
        var x = ImmutableArray.CreateRange(Enumerable.Range(0, 101).Select(i => (double)i));
        var y = ImmutableArray.CreateRange(x.Select(v => v == 40 ? 10.0 : v == 70 ? double.NaN : 0.0));
        var keep = CurveSimplifier.Keep(x, y, 0.5, logX: false);

        Assert.Contains(40, keep);
        Assert.Contains(39, keep);
        Assert.Contains(41, keep);
        Assert.Contains(69, keep);
        Assert.Contains(70, keep);
        Assert.Contains(71, keep);
        Assert.Equal(keep.OrderBy(i => i), keep);
    }
}
