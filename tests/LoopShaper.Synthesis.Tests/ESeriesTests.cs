using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>The preferred-value tables of IEC 60063:2015 and snapping to them.</summary>
public class ESeriesTests
{
    [Theory]
    [InlineData(ESeries.E6, 6)]
    [InlineData(ESeries.E12, 12)]
    [InlineData(ESeries.E24, 24)]
    [InlineData(ESeries.E48, 48)]
    [InlineData(ESeries.E96, 96)]
    [InlineData(ESeries.E192, 192)]
    public void Each_series_has_its_count_of_values_per_decade_strictly_ascending_in_one_decade(ESeries series, int count)
    {
        // IEC 60063:2015: the number in the name is the count per decade.
        var t = StandardValues.Significands(series);
        Assert.Equal(count, t.Length);
        Assert.True(t.Zip(t.Skip(1)).All(p => p.First < p.Second), "ascending");
        int digits = StandardValues.Digits(series);
        Assert.Equal(Math.Pow(10, digits - 1), t[0]);
        Assert.True(t[^1] < Math.Pow(10, digits));
    }

    [Fact]
    public void E6_E12_E24_tables_are_the_standard_two_digit_values()
    {
        // IEC 60063:2015, table of E6, E12 and E24 (values as the standard lists them; from memory of the standard).
        Assert.Equal(new[] { 10, 15, 22, 33, 47, 68 }, StandardValues.Significands(ESeries.E6).ToArray());
        Assert.Equal(new[] { 10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82 }, StandardValues.Significands(ESeries.E12).ToArray());
        Assert.Equal(new[] { 10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91 }, StandardValues.Significands(ESeries.E24).ToArray());
    }

    [Fact]
    public void E24_departs_from_the_geometric_series_exactly_at_the_irregular_values()
    {
        // The E-series are rounded terms of 10^(i/N) (IEC 60063:2015, introduction); the historic E24 values 2.7, 3.0,
        // 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2 are kept although round(10^(i/24), 1) gives 2.6, 2.9, 3.2, 3.5, 3.8, 4.2, 4.6
        // and 8.3. 9.1 is regular (10^(23/24) = 9.085).
        var t = StandardValues.Significands(ESeries.E24);
        var irregular = new List<int>();
        for (int i = 0; i < 24; i++)
        {
            int formula = (int)Math.Round(10 * Math.Pow(10, i / 24.0), MidpointRounding.AwayFromZero);
            if (formula != t[i])
            {
                irregular.Add(t[i]);
                Assert.Equal(1, Math.Abs(formula - t[i]));
            }
        }

        Assert.Equal(new[] { 27, 30, 33, 36, 39, 43, 47, 82 }, irregular.ToArray());
        Assert.Contains(91, t);
        Assert.Contains(51, t);
        Assert.Contains(62, t);
        Assert.Contains(68, t);
    }

    [Theory]
    [InlineData(ESeries.E48, 4, 0)]
    [InlineData(ESeries.E96, 2, 0)]
    [InlineData(ESeries.E192, 1, 1)]
    public void Three_digit_series_are_the_rounded_geometric_series_with_920_the_one_exception(ESeries series, int stride, int exceptions)
    {
        // IEC 60063:2015: E48/E96/E192 are round(100 x 10^(i/N)); E192 lists 920 where the formula gives 919 (from memory
        // of the standard's table), and E96 and E48 skip that position.
        var t = StandardValues.Significands(series);
        int n = t.Length, misses = 0;
        for (int i = 0; i < n; i++)
        {
            int formula = (int)Math.Round(100 * Math.Pow(10, (double)i / n), MidpointRounding.AwayFromZero);
            if (formula != t[i])
            {
                misses++;
                Assert.Equal((919, 920), (formula, t[i]));
            }
        }

        Assert.Equal(exceptions, misses);
        Assert.Equal(t, StandardValues.Significands(ESeries.E192).Where((_, i) => i % stride == 0));
    }

    [Fact]
    public void Coarser_series_are_every_second_value_of_the_finer()
    {
        // IEC 60063:2015: E12 takes every second E24 value, E6 every fourth; E96 every second E192 value, E48 every fourth.
        var e24 = StandardValues.Significands(ESeries.E24);
        Assert.Equal(StandardValues.Significands(ESeries.E12), e24.Where((_, i) => i % 2 == 0));
        Assert.Equal(StandardValues.Significands(ESeries.E6), e24.Where((_, i) => i % 4 == 0));
    }

    [Theory]
    // Spot values of the IEC 60063:2015 tables (from memory of the standard).
    [InlineData(ESeries.E48, 0, 100)]
    [InlineData(ESeries.E48, 20, 261)]
    [InlineData(ESeries.E48, 47, 953)]
    [InlineData(ESeries.E96, 1, 102)]
    [InlineData(ESeries.E96, 48, 316)]
    [InlineData(ESeries.E96, 66, 487)]
    [InlineData(ESeries.E96, 95, 976)]
    [InlineData(ESeries.E192, 1, 101)]
    [InlineData(ESeries.E192, 83, 271)]
    [InlineData(ESeries.E192, 129, 470)]
    [InlineData(ESeries.E192, 185, 920)]
    [InlineData(ESeries.E192, 191, 988)]
    public void Spot_values(ESeries series, int index, int significand)
        => Assert.Equal(significand, StandardValues.Significands(series)[index]);

    [Fact]
    public void Values_are_the_doubles_nearest_their_decimal_digits()
    {
        // Built from the digits, so 4.7 nF is exactly the literal 4.7e-9 and prints as such.
        Assert.Equal(4.7e-9, StandardValues.Snap(4.6e-9, ESeries.E12).Value);
        Assert.Equal(0.91, StandardValues.ValueAt(ESeries.E24, -1));
        Assert.Equal(10.0, StandardValues.ValueAt(ESeries.E24, 24));
        Assert.Equal(48.7e3, StandardValues.ValueAt(ESeries.E96, (4 * 96) + 66));
        Assert.Equal(new[] { 1.0, 1.5, 2.2, 3.3, 4.7, 6.8 }, StandardValues.Decade(ESeries.E6).ToArray());
    }

    [Theory]
    // Nearest in log distance |ln(v / candidate)|, across decades (our definition of "nearest", stated in StandardValues.Snap).
    [InlineData(9.6, ESeries.E24, 10.0)] // ln(10/9.6) = 0.041 < ln(9.6/9.1) = 0.053
    [InlineData(9.5, ESeries.E24, 9.1)] // ln(9.5/9.1) = 0.043 < ln(10/9.5) = 0.051
    [InlineData(0.0097, ESeries.E12, 0.01)]
    [InlineData(4.6e6, ESeries.E6, 4.7e6)]
    [InlineData(1.0e-12, ESeries.E6, 1.0e-12)]
    [InlineData(3.9e3, ESeries.E6, 3.3e3)] // ln(3.9/3.3) = 0.167 < ln(4.7/3.9) = 0.187: nearer in log although 4.7 is nearer in linear distance (0.8 vs 0.6)
    [InlineData(12.45e3, ESeries.E96, 12.4e3)]
    [InlineData(919.4, ESeries.E192, 920.0)]
    public void Snap_picks_the_nearest_value_in_log_distance(double value, ESeries series, double expected)
    {
        var s = StandardValues.Snap(value, series);
        Assert.Equal(expected, s.Value, expected * 1e-12);
        Assert.Equal(100 * (s.Value - value) / value, s.ErrorPct, 1e-9);
    }

    [Theory]
    [InlineData(1.0, 1.5, ESeries.E6)]
    [InlineData(9.1, 10.0, ESeries.E24)]
    [InlineData(4.7e-9, 5.6e-9, ESeries.E12)]
    [InlineData(97.6e3, 100e3, ESeries.E96)]
    public void A_tie_in_log_distance_snaps_to_the_larger_value_and_just_below_it_to_the_smaller(double lower, double upper, ESeries series)
    {
        // The geometric mean is equally far from both in log distance: the documented tie rule takes the larger.
        double mean = Math.Sqrt(lower * upper);
        Assert.Equal(upper, StandardValues.Snap(mean, series).Value, upper * 1e-12);
        Assert.Equal(lower, StandardValues.Snap(mean * (1 - 1e-9), series).Value, lower * 1e-12);
        Assert.Equal(upper, StandardValues.Snap(mean * (1 + 1e-9), series).Value, upper * 1e-12);
    }

    [Fact]
    public void Snap_agrees_with_a_brute_force_search_over_three_decades()
    {
        // Cross-method check: the nearest of every value of the ladder from 0.1 to 1000, by direct comparison.
        var rng = new Random(60063);
        foreach (var series in StandardValues.All)
        {
            int n = StandardValues.Significands(series).Length;
            var ladder = Enumerable.Range(-n, 4 * n + 1).Select(i => StandardValues.ValueAt(series, i)).ToArray();
            for (int k = 0; k < 400; k++)
            {
                double v = Math.Pow(10, 2 * rng.NextDouble());
                double brute = ladder.MinBy(c => Math.Abs(Math.Log(v / c)));
                Assert.Equal(brute, StandardValues.Snap(v, series).Value);
            }
        }
    }

    [Fact]
    public void Steps_cross_decades_and_preferred_values_are_recognised()
    {
        var s = StandardValues.Snap(9.1e3, ESeries.E24);
        Assert.Equal(10e3, StandardValues.Step(s, 1).Value, 1e-9);
        Assert.Equal(8.2e3, StandardValues.Step(s, -1).Value, 1e-9);
        Assert.Equal(0.91, StandardValues.Step(StandardValues.Snap(1.0, ESeries.E24), -1).Value, 1e-15);
        Assert.True(StandardValues.IsPreferred(4.99e3, ESeries.E96));
        Assert.False(StandardValues.IsPreferred(5.0e3, ESeries.E96));
        Assert.True(StandardValues.IsPreferred(5.1e3, ESeries.E24));
    }

    [Fact]
    public void Bad_input_is_rejected_with_a_message()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => StandardValues.Snap(0.0, ESeries.E24));
        Assert.Throws<ArgumentOutOfRangeException>(() => StandardValues.Snap(double.NaN, ESeries.E24));
        Assert.True(StandardValues.TryParse(" e96 ", out var s, out _));
        Assert.Equal(ESeries.E96, s);
        Assert.False(StandardValues.TryParse("E100", out _, out string error));
        Assert.Contains("E6, E12, E24, E48, E96, E192", error, StringComparison.Ordinal);
    }
}
