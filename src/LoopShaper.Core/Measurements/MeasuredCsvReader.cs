using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Measurements;

/// <summary>
/// Reads a measured frequency response (loop gain or plant) from delimited text, all or nothing (docs/measured-csv.md):
/// one sample a line with frequency, gain in dB and phase in degrees, separated by commas, semicolons or tabs; an
/// optional header names the columns (and gives the frequency unit, Hz by default); extra columns are ignored when
/// the header names them. Lines starting with #, ! or % are comments. Phase may be wrapped; it is unwrapped
/// (<see cref="PhaseUnwrapping"/>). Every problem is reported with its line number and nothing is imported.
/// </summary>
public static class MeasuredCsvReader
{
    /// <summary>Most errors listed; reading stops after them.</summary>
    public const int MaxErrors = 20;

    /// <summary>Most samples read.</summary>
    public const int MaxSamples = 200_000;

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Reads bytes as UTF-8 text (a byte-order mark is skipped).</summary>
    public static MeasuredCsvResult Read(ReadOnlySpan<byte> bytes) => Read(System.Text.Encoding.UTF8.GetString(bytes));

    /// <summary>Reads the text of a measured-response file.</summary>
    public static MeasuredCsvResult Read(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var errors = new List<CsvLineError>();
        string[] lines = text.TrimStart('\uFEFF').Split('\n');
        char? separator = null;
        Columns? columns = null;
        var freq = new List<double>();
        var gain = new List<double>();
        var phase = new List<double>();
        int previousLine = 0;

        for (int i = 0; i < lines.Length && errors.Count < MaxErrors; i++)
        {
            int lineNo = i + 1;
            string line = lines[i].TrimEnd('\r');
            if (ControlCharacter(line) is int at)
            {
                errors.Add(new(lineNo, string.Create(Inv, $"binary data (character 0x{(int)line[at]:X2} at column {at + 1}): a measured response is a text file of numbers.")));
                break;
            }

            string trimmed = line.Trim();
            if (trimmed.Length == 0 || trimmed[0] is '#' or '!' or '%')
            {
                continue;
            }

            if (separator is null)
            {
                separator = trimmed.Contains('\t', StringComparison.Ordinal) ? '\t' : trimmed.Contains(';', StringComparison.Ordinal) ? ';' : trimmed.Contains(',', StringComparison.Ordinal) ? ',' : null;
                if (separator is null)
                {
                    errors.Add(new(lineNo, "no column separator: give frequency, gain (dB) and phase (degrees) separated by commas, semicolons or tabs."));
                    break;
                }
            }

            if (MixedSeparator(trimmed, separator.Value) is string mixed)
            {
                errors.Add(new(lineNo, $"{mixed} in a file separated by {SeparatorName(separator.Value)}: use one separator throughout."));
                continue;
            }

            string[] fields = [.. trimmed.Split(separator.Value).Select(f => f.Trim().Trim('"').Trim())];
            if (columns is null)
            {
                if (fields.Any(f => !double.TryParse(NumberText(f, separator.Value), NumberStyles.Float, Inv, out _)))
                {
                    columns = HeaderColumns(fields, lineNo, errors);
                    if (columns is null)
                    {
                        break;
                    }

                    continue;
                }

                if (fields.Length != 3)
                {
                    errors.Add(new(lineNo, string.Create(Inv, $"{fields.Length} values and no header line: without a header a line holds exactly frequency (Hz), gain (dB) and phase (degrees); name the columns in a header to have extra ones ignored.")));
                    break;
                }

                columns = new Columns(0, 1, 2, 3, 1.0, "Hz", []);
            }

            if (fields.Length != columns.Count)
            {
                string what = fields.Length <= columns.PhaseIndex && fields.Length > columns.GainIndex && fields.Length > columns.FrequencyIndex ? " (the phase is missing)" : "";
                errors.Add(new(lineNo, string.Create(Inv, $"{fields.Length} values, expected {columns.Count}{what}.")));
                continue;
            }

            bool ok = TryValue(fields[columns.FrequencyIndex], "frequency", separator.Value, lineNo, errors, out double f);
            ok &= TryValue(fields[columns.GainIndex], "gain", separator.Value, lineNo, errors, out double g);
            ok &= TryValue(fields[columns.PhaseIndex], "phase", separator.Value, lineNo, errors, out double p);
            if (!ok)
            {
                continue;
            }

            double hz = f * columns.FrequencyScale;
            if (!(hz > 0) || !double.IsFinite(hz))
            {
                errors.Add(new(lineNo, string.Create(Inv, $"frequency {fields[columns.FrequencyIndex]} {columns.FrequencyUnit}: must be above 0.")));
                continue;
            }

            if (freq.Count > 0 && !(hz > freq[^1]))
            {
                errors.Add(new(lineNo, string.Create(Inv, $"frequency {hz:G6} Hz is not above {freq[^1]:G6} Hz on line {previousLine}: frequencies must rise strictly from line to line.")));
                continue;
            }

            if (freq.Count >= MaxSamples)
            {
                errors.Add(new(lineNo, string.Create(Inv, $"more than {MaxSamples} samples.")));
                break;
            }

            freq.Add(hz);
            gain.Add(g);
            phase.Add(p);
            previousLine = lineNo;
        }

        if (errors.Count == 0)
        {
            int last = Math.Max(1, lines.Length - (lines[^1].Trim().Length == 0 ? 1 : 0));
            if (columns is null)
            {
                errors.Add(new(1, "the file is empty: expected lines of frequency, gain (dB) and phase (degrees)."));
            }
            else if (freq.Count < 2)
            {
                errors.Add(new(last, string.Create(Inv, $"{freq.Count} sample(s): a measured response needs at least two lines of data.")));
            }
        }

        if (errors.Count > 0)
        {
            if (errors.Count >= MaxErrors)
            {
                errors.Add(new(errors[^1].Line, string.Create(Inv, $"stopped after {MaxErrors} errors.")));
            }

            return new MeasuredCsvResult(null, [.. errors]);
        }

        double[] unwrapped = PhaseUnwrapping.Unwrap(phase, out bool wrapped);
        var samples = new FrequencyResponse([.. freq], [.. gain], [.. unwrapped]);
        return new MeasuredCsvResult(new MeasuredResponse(samples, columns!.FrequencyUnit, wrapped, columns.Ignored), []);
    }

    private sealed record Columns(int FrequencyIndex, int GainIndex, int PhaseIndex, int Count, double FrequencyScale, string FrequencyUnit, ImmutableArray<string> Ignored);

    private static Columns? HeaderColumns(string[] names, int lineNo, List<CsvLineError> errors)
    {
        int f = -1, g = -1, p = -1;
        double scale = 1.0;
        string unit = "Hz";
        var ignored = ImmutableArray.CreateBuilder<string>();
        int before = errors.Count;
        for (int c = 0; c < names.Length; c++)
        {
            string name = names[c], n = name.ToLowerInvariant();
            if (n.Length == 0)
            {
                errors.Add(new(lineNo, string.Create(Inv, $"column {c + 1} of the header has no name: name every column so that extra ones can be ignored.")));
            }
            else if (n.Contains("freq", StringComparison.Ordinal) || n is "f" or "hz" or "khz" or "mhz" or "ghz" || n.StartsWith("f ", StringComparison.Ordinal) || n.StartsWith("f(", StringComparison.Ordinal) || n.StartsWith("f [", StringComparison.Ordinal) || n.StartsWith("f_", StringComparison.Ordinal))
            {
                if (f >= 0)
                {
                    errors.Add(new(lineNo, $"two frequency columns ('{names[f]}' and '{name}')."));
                }

                f = c;
                (scale, unit) = n.Contains("ghz", StringComparison.Ordinal) ? (1e9, "GHz") : n.Contains("mhz", StringComparison.Ordinal) ? (1e6, "MHz") : n.Contains("khz", StringComparison.Ordinal) ? (1e3, "kHz") : (1.0, "Hz");
                if (n.Contains("rad", StringComparison.Ordinal))
                {
                    errors.Add(new(lineNo, $"column '{name}': give the frequency in Hz, kHz or MHz, not rad/s."));
                }
            }
            else if (n.Contains("phase", StringComparison.Ordinal) || n.Contains("deg", StringComparison.Ordinal))
            {
                if (p >= 0)
                {
                    errors.Add(new(lineNo, $"two phase columns ('{names[p]}' and '{name}')."));
                }

                p = c;
                if (n.Contains("rad", StringComparison.Ordinal))
                {
                    errors.Add(new(lineNo, $"column '{name}': give the phase in degrees, not radians."));
                }
            }
            else if (n.Contains("gain", StringComparison.Ordinal) || n.Contains("mag", StringComparison.Ordinal) || n.Contains("db", StringComparison.Ordinal))
            {
                if (g >= 0)
                {
                    errors.Add(new(lineNo, $"two gain columns ('{names[g]}' and '{name}')."));
                }

                g = c;
                if (!n.Contains("db", StringComparison.Ordinal) && (n.Contains("lin", StringComparison.Ordinal) || n.Contains("v/v", StringComparison.Ordinal) || n.Contains("abs", StringComparison.Ordinal)))
                {
                    errors.Add(new(lineNo, $"column '{name}': give the gain in dB (20 log10 |H|), not as a linear ratio."));
                }
            }
            else
            {
                ignored.Add(name);
            }
        }

        foreach (var (index, what) in new[] { (f, "frequency"), (g, "gain (dB)"), (p, "phase (degrees)") })
        {
            if (index < 0)
            {
                errors.Add(new(lineNo, $"the header names no {what} column: name a frequency, a gain (dB) and a phase (degrees) column, for example 'Frequency (Hz),Gain (dB),Phase (deg)'."));
            }
        }

        return errors.Count > before ? null : new Columns(f, g, p, names.Length, scale, unit, ignored.ToImmutable());
    }

    private static bool TryValue(string field, string what, char separator, int lineNo, List<CsvLineError> errors, out double value)
    {
        if (field.Length == 0)
        {
            errors.Add(new(lineNo, $"the {what} is empty."));
            value = 0;
            return false;
        }

        if (!double.TryParse(NumberText(field, separator), NumberStyles.Float, Inv, out value))
        {
            errors.Add(new(lineNo, $"{what} '{field}' is not a number."));
            return false;
        }

        if (!double.IsFinite(value))
        {
            errors.Add(new(lineNo, $"{what} '{field}' is not a finite number."));
            return false;
        }

        return true;
    }

    /// <summary>A decimal comma ("1,5") is read as a point when the separator is not a comma.</summary>
    private static string NumberText(string field, char separator)
        => separator != ',' && field.Count(c => c == ',') == 1 && !field.Contains('.', StringComparison.Ordinal) ? field.Replace(',', '.') : field;

    private static string? MixedSeparator(string line, char separator) => separator switch
    {
        ',' when line.Contains(';', StringComparison.Ordinal) => "a semicolon",
        ',' or ';' when line.Contains('\t', StringComparison.Ordinal) => "a tab",
        '\t' when line.Contains(';', StringComparison.Ordinal) => "a semicolon",
        _ => null,
    };

    private static string SeparatorName(char separator) => separator switch
    {
        ',' => "commas",
        ';' => "semicolons",
        _ => "tabs",
    };

    private static int? ControlCharacter(string line)
    {
        for (int i = 0; i < line.Length; i++)
        {
            char c = line[i];
            if ((c < ' ' && c != '\t') || (c >= '\u007F' && c <= '\u009F') || c == '\uFFFD')
            {
                return i;
            }
        }

        return null;
    }
}
