using LoopShaper.Core.Units;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli;

/// <summary>Values typed on the command line: SI prefixes and units (<see cref="SiValue"/>), ranges checked, errors naming the option.</summary>
internal static class CommandLineValues
{
    /// <summary>
    /// Parses an optional value of <paramref name="option"/> in <paramref name="unit"/>, checks min &lt;= value &lt;= max;
    /// false after writing "error: --option: ..." (a missing value is true with null).
    /// </summary>
    public static bool TryRead(string? text, string option, string unit, double min, double max, TextWriter error, out double? value)
    {
        value = null;
        if (text is null)
        {
            return true;
        }

        if (!SiValue.TryParse(text, unit, out double v, out string message))
        {
            error.WriteLine($"error: {option}: {message}");
            return false;
        }

        var c = new Checks();
        if (!c.InRange(option, v, min, max, unit))
        {
            foreach (var issue in c.Issues)
            {
                error.WriteLine($"error: {issue}");
            }

            return false;
        }

        value = v;
        return true;
    }
}
