using LoopShaper.Core.Units;

namespace LoopShaper.Web.Model;

/// <summary>Text for a number shown in a field: engineering notation with as many digits as it takes to read back the same value.</summary>
public static class FieldText
{
    /// <summary>"680 nH", "12.34 V", "4": the shortest engineering form that parses back to <paramref name="value"/> within 1e-9.</summary>
    public static string Format(double value, string unit)
    {
        // Plain ratios (a duty cycle of 0.9) read better without a prefix than as "900m".
        if (unit.Length == 0 && Math.Abs(value) >= 1e-3 && Math.Abs(value) < 1e3)
        {
            return value.ToString("G15", System.Globalization.CultureInfo.InvariantCulture);
        }

        for (int digits = 3; digits <= 15; digits++)
        {
            string text = TrimZeros(EngineeringFormat.Format(value, unit, digits));
            if (SiValue.TryParse(text, unit, out double back, out _) && Math.Abs(back - value) <= 1e-9 * Math.Abs(value))
            {
                return text;
            }
        }

        return TrimZeros(EngineeringFormat.Format(value, unit, 15));
    }

    /// <summary>Engineering notation rounded to <paramref name="significantDigits"/>, trailing zeros dropped ("47.25 kHz").</summary>
    public static string Format(double value, string unit, int significantDigits) => TrimZeros(EngineeringFormat.Format(value, unit, significantDigits));

    private static string TrimZeros(string text)
    {
        int space = text.IndexOf(' ', StringComparison.Ordinal);
        string number = space < 0 ? text : text[..space];
        string rest = space < 0 ? string.Empty : text[space..];
        if (number.Contains('.', StringComparison.Ordinal))
        {
            number = number.TrimEnd('0').TrimEnd('.');
        }

        return number + rest;
    }
}
