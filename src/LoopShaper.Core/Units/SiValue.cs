using System.Globalization;

namespace LoopShaper.Core.Units;

/// <summary>
/// Parses numbers typed with SI prefixes and an optional unit symbol: "4.7 uH", "10k", "2.2µF", "500kHz", "1e-6"
/// (shared/CONVENTIONS.md: M is mega, m is milli; culture-invariant; anything else is rejected with a message).
/// </summary>
public static class SiValue
{
    private static readonly Dictionary<string, double> Multipliers = new(StringComparer.Ordinal)
    {
        ["f"] = 1e-15,
        ["p"] = 1e-12,
        ["n"] = 1e-9,
        ["u"] = 1e-6,
        ["µ"] = 1e-6,
        ["μ"] = 1e-6,
        ["m"] = 1e-3,
        ["k"] = 1e3,
        ["M"] = 1e6,
        ["G"] = 1e9,
        ["T"] = 1e12,
    };

    /// <summary>
    /// Parses text to a value in base units. The unit symbol, when present, must be <paramref name="unit"/>
    /// ("H", "F", "Hz", "V", "A", "Ohm" also written as "Ω" or "R", "s", "dB", "deg", "%"); returns false with a message otherwise.
    /// </summary>
    public static bool TryParse(string? text, string unit, out double value, out string error)
    {
        value = double.NaN;
        error = string.Empty;
        var s = (text ?? string.Empty).Trim();
        if (s.Length == 0)
        {
            error = "is empty: enter a number" + (unit.Length > 0 ? $" in {unit}" : string.Empty) + ".";
            return false;
        }

        // Longest numeric prefix (digits, sign, point, exponent).
        int i = 0;
        while (i < s.Length && (char.IsDigit(s[i]) || s[i] is '+' or '-' or '.'
            || ((s[i] is 'e' or 'E') && i + 1 < s.Length && (char.IsDigit(s[i + 1]) || s[i + 1] is '+' or '-'))))
        {
            i++;
        }

        if (i == 0 || !double.TryParse(s[..i], NumberStyles.Float, CultureInfo.InvariantCulture, out double number))
        {
            error = $"'{s}' is not a number; write for example 4.7u{unit}, 10k or 1e-6.";
            return false;
        }

        var rest = s[i..].Trim();
        double mult = 1.0;
        var units = Aliases(unit);
        string? matchedUnit = units.FirstOrDefault(u => u.Length > 0 && rest.EndsWith(u, StringComparison.Ordinal));
        if (matchedUnit is not null)
        {
            rest = rest[..^matchedUnit.Length].Trim();
        }

        if (rest.Length > 0)
        {
            if (!Multipliers.TryGetValue(rest, out mult))
            {
                error = unit.Length > 0
                    ? $"'{s}' has an unknown prefix or a unit other than {unit}; allowed prefixes p n u m k M G."
                    : $"'{s}' has an unknown prefix; allowed prefixes p n u m k M G.";
                return false;
            }
        }

        value = number * mult;
        if (!double.IsFinite(value))
        {
            error = $"'{s}' is not a finite number.";
            return false;
        }

        return true;
    }

    private static string[] Aliases(string unit) => unit switch
    {
        "Ohm" => ["Ohm", "ohm", "Ω", "R"],
        "deg" => ["deg", "°"],
        _ => [unit],
    };
}
