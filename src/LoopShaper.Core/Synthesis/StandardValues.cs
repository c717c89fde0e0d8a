using System.Collections.Immutable;
using System.Globalization;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// The preferred-value tables of IEC 60063:2015 and snapping to them. Each table holds the significands of one decade
/// as integers (two digits for E6 to E24, three for E48 to E192); a value is significand x 10^k. The tables are
/// written out as the standard lists them, not computed: E24 (and so E12 and E6) departs from round(10^(i/24)) at
/// 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2, and E192 lists 920 where round(10^(185/192)) gives 919.
/// </summary>
public static class StandardValues
{
    /// <summary>Two log distances closer than this (in ln units) are a tie; a tie snaps to the larger value.</summary>
    public const double TieToleranceLn = 1e-12;

    private static readonly ImmutableArray<int> E24Table =
    [
        10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91,
    ];

    private static readonly ImmutableArray<int> E192Table =
    [
        100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127, 129, 130, 132,
        133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172, 174, 176,
        178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234,
        237, 240, 243, 246, 249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312,
        316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417,
        422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556,
        562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715, 723, 732, 741,
        750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953, 965, 976, 988,
    ];

    // E12 and E6 are every second and every fourth E24 value, E96 and E48 every second and every fourth E192 value
    // (IEC 60063:2015, the tables side by side). Kept as literal tables all the same, so that each can be read and checked.
    private static readonly ImmutableArray<int> E6Table = [10, 15, 22, 33, 47, 68];

    private static readonly ImmutableArray<int> E12Table = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82];

    private static readonly ImmutableArray<int> E48Table =
    [
        100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301,
        316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953,
    ];

    private static readonly ImmutableArray<int> E96Table =
    [
        100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174,
        178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309,
        316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549,
        562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976,
    ];

    /// <summary>Every series, coarsest first.</summary>
    public static ImmutableArray<ESeries> All { get; } = [ESeries.E6, ESeries.E12, ESeries.E24, ESeries.E48, ESeries.E96, ESeries.E192];

    /// <summary>The significands of one decade as integers, ascending: 10..91 for E24, 100..988 for E192.</summary>
    public static ImmutableArray<int> Significands(ESeries series) => series switch
    {
        ESeries.E6 => E6Table,
        ESeries.E12 => E12Table,
        ESeries.E24 => E24Table,
        ESeries.E48 => E48Table,
        ESeries.E96 => E96Table,
        ESeries.E192 => E192Table,
        _ => throw new ArgumentOutOfRangeException(nameof(series), series, "Unknown series."),
    };

    /// <summary>Significant digits of the series: 2 for E6 to E24, 3 for E48 to E192.</summary>
    public static int Digits(ESeries series) => series <= ESeries.E24 ? 2 : 3;

    /// <summary>The values of the decade [1, 10) as decimals: 1.0, 1.5, 2.2, ... for E6.</summary>
    public static ImmutableArray<double> Decade(ESeries series) => [.. Enumerable.Range(0, Significands(series).Length).Select(i => ValueAt(series, i))];

    /// <summary>The preferred value at a position of the whole ladder (index 0 is 1.0, the count of the series is 10, -1 is the top of the decade below).</summary>
    public static double ValueAt(ESeries series, int index)
    {
        var table = Significands(series);
        int n = table.Length;
        int decade = (int)Math.Floor((double)index / n);
        int i = index - (decade * n);
        // Built from its decimal digits, so that 4.7 nF is the double nearest 4.7e-9 and prints as such.
        int exponent = decade - (Digits(series) - 1);
        return double.Parse(string.Create(CultureInfo.InvariantCulture, $"{table[i]}E{exponent}"), CultureInfo.InvariantCulture);
    }

    /// <summary>
    /// The preferred value nearest to a positive value in log distance |ln(v / candidate)|, across decade edges
    /// (9.6 in E24 goes to 10, not 9.1). A tie (both distances equal to within <see cref="TieToleranceLn"/>) goes to the
    /// larger value.
    /// </summary>
    public static StandardValue Snap(double value, ESeries series)
    {
        if (!(value > 0) || !double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(nameof(value), value, "Only finite positive values snap to a preferred series.");
        }

        int n = Significands(series).Length;
        int decade = (int)Math.Floor(Math.Log10(value));
        // Round-off in log10 may put the value one decade off; the search below spans neighbours on both sides.
        int first = ((decade - 1) * n) - 1, last = ((decade + 2) * n) + 1;
        double ln = Math.Log(value);
        int best = first;
        double bestDistance = double.PositiveInfinity;
        for (int k = first; k <= last; k++)
        {
            double d = Math.Abs(ln - Math.Log(ValueAt(series, k)));
            // Ascending candidates: a later one that ties takes the place (ties go to the larger value).
            if (d < bestDistance - TieToleranceLn || Math.Abs(d - bestDistance) <= TieToleranceLn)
            {
                best = k;
                bestDistance = Math.Min(d, bestDistance);
            }
        }

        return new StandardValue(value, ValueAt(series, best), series, best);
    }

    /// <summary>The preferred value a number of steps up (positive) or down (negative) the ladder from a snapped one.</summary>
    public static StandardValue Step(StandardValue start, int steps)
        => start with { Value = ValueAt(start.Series, start.Index + steps), Index = start.Index + steps };

    /// <summary>True when the value is a preferred value of the series (to 1e-9 relative).</summary>
    public static bool IsPreferred(double value, ESeries series)
    {
        if (!(value > 0) || !double.IsFinite(value))
        {
            return false;
        }

        var s = Snap(value, series);
        return Math.Abs(s.Value - value) <= 1e-9 * value;
    }

    /// <summary>Reads a series name ("E96", "e12"); false with a message for anything else.</summary>
    public static bool TryParse(string? text, out ESeries series, out string error)
    {
        series = ESeries.E24;
        string t = (text ?? string.Empty).Trim().ToUpperInvariant();
        foreach (var s in All)
        {
            if (t == s.ToString())
            {
                series = s;
                error = string.Empty;
                return true;
            }
        }

        error = $"'{text}' is not a series: allowed E6, E12, E24, E48, E96, E192 (IEC 60063).";
        return false;
    }
}
