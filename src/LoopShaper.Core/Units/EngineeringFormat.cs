using System.Globalization;

namespace LoopShaper.Core.Units;

/// <summary>Engineering notation with SI prefixes, culture-invariant (shared/CONVENTIONS.md: three significant digits by default).</summary>
public static class EngineeringFormat
{
    private static readonly (int Exponent, string Prefix)[] Prefixes =
    [
        (-15, "f"), (-12, "p"), (-9, "n"), (-6, "u"), (-3, "m"), (0, ""), (3, "k"), (6, "M"), (9, "G"), (12, "T"),
    ];

    /// <summary>Formats a value as "4.70 uH": mantissa in [1, 1000), SI prefix, unit.</summary>
    public static string Format(double value, string unit = "", int significantDigits = 3)
    {
        if (!double.IsFinite(value))
        {
            return double.IsNaN(value) ? "n/a" : (value > 0 ? "+inf " : "-inf ") + unit;
        }

        string sep = unit.Length > 0 ? " " : string.Empty;
        if (value == 0.0)
        {
            return "0" + sep + unit;
        }

        double mag = Math.Abs(value);
        int exp3 = (int)Math.Floor(Math.Log10(mag) / 3.0) * 3;
        if (exp3 < -15 || exp3 > 12)
        {
            // Beyond the prefix table: scientific notation, never hundreds of digits.
            return value.ToString("G" + significantDigits.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) + sep + unit;
        }

        double mant = value / Math.Pow(10, exp3);
        // Rounding may carry the mantissa to 1000.
        int digitsBefore = Math.Abs(mant) >= 100 ? 3 : Math.Abs(mant) >= 10 ? 2 : 1;
        int decimals = Math.Max(significantDigits - digitsBefore, 0);
        double rounded = Math.Round(mant, decimals);
        if (Math.Abs(rounded) >= 1000 && exp3 < 12)
        {
            exp3 += 3;
            mant = value / Math.Pow(10, exp3);
            decimals = Math.Max(significantDigits - 1, 0);
            rounded = Math.Round(mant, decimals);
        }

        string prefix = Prefixes.First(p => p.Exponent == exp3).Prefix;
        return rounded.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) + sep + prefix + unit;
    }
}
