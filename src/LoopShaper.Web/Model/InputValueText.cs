using System.Globalization;
using LoopShaper.Core.Units;

namespace LoopShaper.Web.Model;

/// <summary>
/// A design-file value as the compare table shows it: a number in engineering notation (up to six significant digits) with the unit its field name
/// carries (inductanceH, dcrOhm, switchingFrequencyHz, or the parent's, as in inputVoltageV.min); other values as written.
/// </summary>
public static class InputValueText
{
    private static readonly (string Suffix, string Unit)[] Units =
    [
        ("APerS", "A/s"), ("PerVolt", string.Empty), ("Ohm", "Ω"), ("Hz", "Hz"), ("Deg", "deg"), ("Db", "dB"), ("Pct", "%"),
        ("transconductanceS", "S"), ("H", "H"), ("F", "F"), ("V", "V"), ("A", "A"), ("S", "s"),
    ];

    /// <summary>The shown text of <paramref name="raw"/> (JSON text) at <paramref name="path"/>; "absent" for a missing field.</summary>
    public static string Of(string path, string? raw)
    {
        if (raw is null)
        {
            return "absent";
        }

        if (!double.TryParse(raw, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !double.IsFinite(value))
        {
            return raw;
        }

        string? unit = UnitOf(path);
        return unit switch
        {
            null or "" => value.ToString("G6", CultureInfo.InvariantCulture),
            "deg" or "dB" or "%" => value.ToString("G6", CultureInfo.InvariantCulture) + " " + unit,
            _ => Trimmed(EngineeringFormat.Format(value, unit, 6)),
        };
    }

    /// <summary>"680.000 nH" as "680 nH": six significant digits shown only as far as they are not trailing zeros.</summary>
    private static string Trimmed(string formatted)
    {
        int space = formatted.IndexOf(' ', StringComparison.Ordinal);
        string number = space < 0 ? formatted : formatted[..space];
        string rest = space < 0 ? string.Empty : formatted[space..];
        return (number.Contains('.', StringComparison.Ordinal) ? number.TrimEnd('0').TrimEnd('.') : number) + rest;
    }

    /// <summary>The unit of the nearest path segment whose name ends in a unit suffix after a lower-case letter; null when none does.</summary>
    public static string? UnitOf(string path)
    {
        var segments = path.Split('.', StringSplitOptions.RemoveEmptyEntries);
        for (int i = segments.Length - 1; i >= 0; i--)
        {
            string name = segments[i];
            int bracket = name.IndexOf('[', StringComparison.Ordinal);
            if (bracket >= 0)
            {
                name = name[..bracket];
            }

            foreach (var (suffix, unit) in Units)
            {
                if (name.EndsWith(suffix, StringComparison.Ordinal) && (name.Length == suffix.Length ? suffix.Length > 2 : char.IsLower(name[^(suffix.Length + 1)]) || char.IsDigit(name[^(suffix.Length + 1)])))
                {
                    return unit;
                }
            }
        }

        return null;
    }
}
