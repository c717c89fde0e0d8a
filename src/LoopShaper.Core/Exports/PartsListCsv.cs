using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Units;

namespace LoopShaper.Core.Exports;

/// <summary>
/// The parts list as CSV (RFC 4180: comma separated, fields with a comma, quote or line break in double quotes, quotes
/// doubled), one header line, then one line per part:
/// designator,value,unit,display,series,tolerance_pct,role.
/// "value" is the exact number in base units (ohms, farads), culture-invariant and round-trip; "display" the same value
/// in engineering notation for people ("4.70 nF"); "series" is E6..E192 or empty for a value not snapped.
/// </summary>
public static class PartsListCsv
{
    /// <summary>The header line.</summary>
    public const string Header = "designator,value,unit,display,series,tolerance_pct,role";

    /// <summary>Writes the parts list of a synthesis (the parts to build).</summary>
    public static string Write(NetworkSynthesis synthesis) => Write(synthesis.ChosenParts.Select(PartsListEntry.From));

    /// <summary>The parts list of an OTA synthesis (the parts to build).</summary>
    public static string Write(OtaNetworkSynthesis synthesis) => Write(synthesis.ChosenParts.Select(PartsListEntry.From));

    /// <summary>Writes a parts list.</summary>
    public static string Write(IEnumerable<PartsListEntry> entries)
    {
        var inv = CultureInfo.InvariantCulture;
        var sb = new StringBuilder();
        sb.Append(Header).Append('\n');
        foreach (var e in entries)
        {
            sb.Append(Field(e.Designator)).Append(',')
              .Append(e.Value.ToString("R", inv)).Append(',')
              .Append(e.Unit).Append(',')
              .Append(Field(EngineeringFormat.Format(e.Value, e.Unit, 3))).Append(',')
              .Append(e.Series?.ToString() ?? string.Empty).Append(',')
              .Append(e.TolerancePct.ToString("R", inv)).Append(',')
              .Append(Field(e.Role)).Append('\n');
        }

        return sb.ToString();
    }

    /// <summary>Reads a parts list; throws <see cref="FormatException"/> naming the line and the field on bad input.</summary>
    public static ImmutableArray<PartsListEntry> Parse(string text)
        => TryParse(text, out var entries, out var errors) ? entries : throw new FormatException(string.Join(" ", errors));

    /// <summary>Reads a parts list; false with one message per bad line.</summary>
    public static bool TryParse(string text, out ImmutableArray<PartsListEntry> entries, out ImmutableArray<string> errors)
    {
        var inv = CultureInfo.InvariantCulture;
        var list = new List<PartsListEntry>();
        var errs = new List<string>();
        var records = Records(text ?? string.Empty, errs);
        if (records.Count == 0 || string.Join(",", records[0].Fields) != Header)
        {
            errs.Insert(0, $"line 1: the header must be '{Header}'.");
        }
        else
        {
            foreach (var (line, f) in records.Skip(1))
            {
                if (f.Count == 1 && f[0].Length == 0)
                {
                    continue;
                }

                if (f.Count != 7)
                {
                    errs.Add($"line {line}: {f.Count} fields, expected 7 ({Header}).");
                    continue;
                }

                string where = $"line {line} ({f[0]})";
                if (f[0].Length == 0)
                {
                    errs.Add($"line {line}: designator is empty.");
                    continue;
                }

                if (!double.TryParse(f[1], NumberStyles.Float, inv, out double value) || !(value > 0) || !double.IsFinite(value))
                {
                    errs.Add($"{where}: value '{f[1]}' is not a finite positive number in ohms or farads.");
                    continue;
                }

                PartKind kind;
                if (f[2] == "Ohm")
                {
                    kind = PartKind.Resistor;
                }
                else if (f[2] == "F")
                {
                    kind = PartKind.Capacitor;
                }
                else
                {
                    errs.Add($"{where}: unit '{f[2]}' is not Ohm or F.");
                    continue;
                }

                if (!SiValue.TryParse(f[3], f[2], out double shown, out _) || Math.Abs(shown - value) > 5e-3 * value)
                {
                    errs.Add($"{where}: display '{f[3]}' does not agree with value {f[1]} {f[2]}; edit both or delete the display text and write the value again.");
                    continue;
                }

                ESeries? series = null;
                if (f[4].Length > 0)
                {
                    if (!StandardValues.TryParse(f[4], out var s, out string serr))
                    {
                        errs.Add($"{where}: series {serr}");
                        continue;
                    }

                    series = s;
                }

                if (!double.TryParse(f[5], NumberStyles.Float, inv, out double tol) || !(tol >= 0) || tol > 50)
                {
                    errs.Add($"{where}: tolerance_pct '{f[5]}' is out of range: allowed 0 to 50.");
                    continue;
                }

                list.Add(new PartsListEntry(f[0], kind, value, series, tol, f[6]));
            }
        }

        entries = [.. list];
        errors = [.. errs];
        return errs.Count == 0;
    }

    private static string Field(string s)
        => s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;

    /// <summary>Splits RFC 4180 text into records of fields, with the line number each record starts on.</summary>
    private static List<(int Line, List<string> Fields)> Records(string text, List<string> errors)
    {
        var records = new List<(int, List<string>)>();
        var fields = new List<string>();
        var field = new StringBuilder();
        int line = 1, startLine = 1;
        bool quoted = false, any = false;
        for (int i = 0; i < text.Length; i++)
        {
            char ch = text[i];
            if (quoted)
            {
                if (ch == '"' && i + 1 < text.Length && text[i + 1] == '"')
                {
                    field.Append('"');
                    i++;
                }
                else if (ch == '"')
                {
                    quoted = false;
                }
                else
                {
                    if (ch == '\n')
                    {
                        line++;
                    }

                    field.Append(ch);
                }

                continue;
            }

            switch (ch)
            {
                case '"' when field.Length == 0:
                    quoted = true;
                    any = true;
                    break;
                case ',':
                    fields.Add(field.ToString());
                    field.Clear();
                    any = true;
                    break;
                case '\r':
                    break;
                case '\n':
                    fields.Add(field.ToString());
                    records.Add((startLine, fields));
                    fields = [];
                    field.Clear();
                    any = false;
                    line++;
                    startLine = line;
                    break;
                default:
                    field.Append(ch);
                    any = true;
                    break;
            }
        }

        if (quoted)
        {
            errors.Add($"line {startLine}: a quoted field is not closed.");
        }

        if (any || field.Length > 0)
        {
            fields.Add(field.ToString());
            records.Add((startLine, fields));
        }

        return records;
    }
}
