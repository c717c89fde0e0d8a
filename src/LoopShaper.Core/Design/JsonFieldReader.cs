using System.Globalization;
using System.Text.Json;
using LoopShaper.Core.Units;
using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Design;

/// <summary>
/// Reads the fields of one JSON object of a design file, recording every problem with its JSON path: missing and
/// unknown fields, wrong types, unknown words, numbers with the wrong unit. A reader for an object that is missing or
/// not an object is silent: it returns fallbacks and records nothing more, so one mistake gives one message.
/// Numbers are JSON numbers in the field's base unit or text with an SI prefix and unit parsed by <see cref="SiValue"/>.
/// </summary>
internal sealed class JsonFieldReader
{
    private readonly JsonElement _element;
    private readonly List<ValidationIssue> _errors;
    private readonly HashSet<string> _known = new(StringComparer.Ordinal);
    private readonly bool _silent;

    private JsonFieldReader(JsonElement element, string path, List<ValidationIssue> errors, bool silent)
    {
        _element = element;
        Path = path;
        _errors = errors;
        _silent = silent;
    }

    /// <summary>False for a silent reader (the object is missing or not an object).</summary>
    public bool IsObject => !_silent;

    /// <summary>JSON path of this object, e.g. "$.plant.powerStage".</summary>
    public string Path { get; }

    /// <summary>Opens an element that must be an object; records an error and returns a silent reader otherwise.</summary>
    public static JsonFieldReader Open(JsonElement element, string path, List<ValidationIssue> errors)
    {
        if (element.ValueKind != JsonValueKind.Object)
        {
            errors.Add(new ValidationIssue(path, $"must be an object {{ ... }}; got {Describe(element)}."));
            return new JsonFieldReader(default, path, errors, silent: true);
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var p in element.EnumerateObject())
        {
            if (!seen.Add(p.Name))
            {
                errors.Add(new ValidationIssue(Child(path, p.Name), "appears more than once in the object."));
            }
        }

        return new JsonFieldReader(element, path, errors, silent: false);
    }

    /// <summary>The path of a field of the object at <paramref name="path"/>.</summary>
    public static string Child(string path, string name)
        => name.Length > 0 && name.All(c => char.IsAsciiLetterOrDigit(c) || c == '_') && !char.IsAsciiDigit(name[0])
            ? $"{path}.{name}"
            : $"{path}['{name.Replace("'", "\\'", StringComparison.Ordinal)}']";

    /// <summary>True when the field is present (whatever its value).</summary>
    public bool Has(string name)
    {
        _known.Add(name);
        return !_silent && _element.TryGetProperty(name, out _);
    }

    /// <summary>Records an error when the field is present in a file older than the version that introduced it.</summary>
    public void NeedsVersion(string name, int fileVersion, int introducedIn)
    {
        if (fileVersion < introducedIn && !_silent && _element.TryGetProperty(name, out _))
        {
            Error(Child(Path, name), $"is a field of design-file version {introducedIn}; this file says \"version\": {fileVersion}. Set \"version\": {introducedIn} to use it.");
        }
    }

    /// <summary>Marks every field as known, for an object whose allowed fields cannot be told (an unknown kind word).</summary>
    public void AcceptAll()
    {
        if (!_silent)
        {
            foreach (var p in _element.EnumerateObject())
            {
                _known.Add(p.Name);
            }
        }
    }

    /// <summary>Records an error for every field that no read asked for.</summary>
    public void Finish(string what)
    {
        if (_silent)
        {
            return;
        }

        var allowed = string.Join(", ", _known.Order(StringComparer.Ordinal));
        foreach (var p in _element.EnumerateObject())
        {
            if (!_known.Contains(p.Name))
            {
                Error(Child(Path, p.Name), $"is not a field of {what}; allowed fields: {allowed}.");
            }
        }
    }

    /// <summary>A required number in <paramref name="unit"/>; NaN after an error.</summary>
    public double Number(string name, string unit)
        => Get(name, out var e, out string path) ? (ParseNumber(e, path, unit) ?? double.NaN) : MissingNumber(name, unit);

    /// <summary>An optional number in <paramref name="unit"/>.</summary>
    public double Number(string name, string unit, double fallback)
        => Get(name, out var e, out string path) ? (ParseNumber(e, path, unit) ?? double.NaN) : fallback;

    /// <summary>A number that may be absent or JSON null (null then); required when <paramref name="requiredBecause"/> is given.</summary>
    public double? NullableNumber(string name, string unit, string? requiredBecause = null)
    {
        if (!Get(name, out var e, out string path) || e.ValueKind == JsonValueKind.Null)
        {
            if (requiredBecause is not null && !_silent)
            {
                Error(Child(Path, name), $"is required {requiredBecause}: {DescribeUnit(unit)}.");
            }

            return null;
        }

        return ParseNumber(e, path, unit) ?? double.NaN;
    }

    /// <summary>A required whole number.</summary>
    public int Integer(string name)
    {
        if (Get(name, out var e, out string path))
        {
            return ParseInteger(e, path) ?? 0;
        }

        Missing(name, "a whole number");
        return 0;
    }

    /// <summary>An optional whole number.</summary>
    public int Integer(string name, int fallback) => Get(name, out var e, out string path) ? (ParseInteger(e, path) ?? fallback) : fallback;

    /// <summary>An optional true or false.</summary>
    public bool Boolean(string name, bool fallback)
    {
        if (!Get(name, out var e, out string path))
        {
            return fallback;
        }

        if (e.ValueKind is JsonValueKind.True or JsonValueKind.False)
        {
            return e.GetBoolean();
        }

        Error(path, $"must be true or false; got {Describe(e)}.");
        return fallback;
    }

    /// <summary>A required text.</summary>
    public string Text(string name)
    {
        if (Get(name, out var e, out string path))
        {
            return ParseText(e, path) ?? string.Empty;
        }

        Missing(name, "a text in quotes");
        return string.Empty;
    }

    /// <summary>An optional text.</summary>
    public string Text(string name, string fallback) => Get(name, out var e, out string path) ? (ParseText(e, path) ?? fallback) : fallback;

    /// <summary>A required word from a fixed list; null when missing or not in the list (error recorded).</summary>
    public T? Word<T>(string name, IReadOnlyList<(string Word, T Value)> words)
        where T : struct
    {
        if (Get(name, out var e, out string path))
        {
            return ParseWord(e, path, words);
        }

        Missing(name, "one of " + Quoted(words.Select(w => w.Word)));
        return null;
    }

    /// <summary>An optional word from a fixed list.</summary>
    public T Word<T>(string name, IReadOnlyList<(string Word, T Value)> words, T fallback)
        where T : struct
        => Get(name, out var e, out string path) ? (ParseWord(e, path, words) ?? fallback) : fallback;

    /// <summary>A required object; a silent reader when it is missing or not an object.</summary>
    public JsonFieldReader Object(string name)
    {
        if (Get(name, out var e, out string path))
        {
            return Open(e, path, _errors);
        }

        Missing(name, "an object { ... }");
        return new JsonFieldReader(default, Child(Path, name), _errors, silent: true);
    }

    /// <summary>An optional object; null when absent.</summary>
    public JsonFieldReader? OptionalObject(string name) => Get(name, out var e, out string path) ? Open(e, path, _errors) : null;

    /// <summary>The items of an array with their paths; empty (error recorded) when required and missing or not an array.</summary>
    public IReadOnlyList<(JsonElement Item, string Path)> Array(string name, bool required)
    {
        if (!Get(name, out var e, out string path))
        {
            if (required)
            {
                Missing(name, "an array [ ... ]");
            }

            return [];
        }

        if (e.ValueKind != JsonValueKind.Array)
        {
            Error(path, $"must be an array [ ... ]; got {Describe(e)}.");
            return [];
        }

        return [.. e.EnumerateArray().Select((item, i) => (item, $"{path}[{i.ToString(CultureInfo.InvariantCulture)}]"))];
    }

    /// <summary>A number from an element (array item) in <paramref name="unit"/>; null after an error.</summary>
    public double? ParseNumber(JsonElement e, string path, string unit)
    {
        switch (e.ValueKind)
        {
            case JsonValueKind.Number:
                if (e.TryGetDouble(out double v) && double.IsFinite(v))
                {
                    return v;
                }

                Error(path, $"{e.GetRawText()} is not a finite number.");
                return null;
            case JsonValueKind.String:
                if (SiValue.TryParse(e.GetString(), unit, out double parsed, out string message))
                {
                    return parsed;
                }

                Error(path, $"expects {DescribeUnit(unit)}: {message}");
                return null;
            default:
                Error(path, $"must be {DescribeUnit(unit)}; got {Describe(e)}.");
                return null;
        }
    }

    /// <summary>Opens an array item that must be an object.</summary>
    public JsonFieldReader OpenItem(JsonElement item, string path) => Open(item, path, _errors);

    private int? ParseInteger(JsonElement e, string path)
    {
        if (e.ValueKind is not (JsonValueKind.Number or JsonValueKind.String))
        {
            Error(path, $"must be a whole number; got {Describe(e)}.");
            return null;
        }

        if (ParseNumber(e, path, string.Empty) is not double d)
        {
            return null;
        }

        if (d != Math.Floor(d) || d < int.MinValue || d > int.MaxValue)
        {
            Error(path, $"must be a whole number; got {d.ToString("R", CultureInfo.InvariantCulture)}.");
            return null;
        }

        return (int)d;
    }

    private string? ParseText(JsonElement e, string path)
    {
        if (e.ValueKind == JsonValueKind.String)
        {
            return e.GetString();
        }

        Error(path, $"must be a text in quotes; got {Describe(e)}.");
        return null;
    }

    private T? ParseWord<T>(JsonElement e, string path, IReadOnlyList<(string Word, T Value)> words)
        where T : struct
    {
        string allowed = Quoted(words.Select(w => w.Word));
        if (e.ValueKind != JsonValueKind.String)
        {
            Error(path, $"must be one of {allowed}; got {Describe(e)}.");
            return null;
        }

        string s = e.GetString() ?? string.Empty;
        foreach (var (word, value) in words)
        {
            if (string.Equals(word, s, StringComparison.Ordinal))
            {
                return value;
            }
        }

        Error(path, $"\"{s}\" is not allowed here: use one of {allowed}.");
        return null;
    }

    private bool Get(string name, out JsonElement value, out string path)
    {
        _known.Add(name);
        path = Child(Path, name);
        value = default;
        return !_silent && _element.TryGetProperty(name, out value);
    }

    private double MissingNumber(string name, string unit)
    {
        Missing(name, DescribeUnit(unit));
        return double.NaN;
    }

    private void Missing(string name, string what)
    {
        if (!_silent)
        {
            Error(Child(Path, name), $"is required: {what}.");
        }
    }

    /// <summary>Records an error at a path (a check the reader makes across fields, such as a repeated label).</summary>
    public void Error(string path, string message) => _errors.Add(new ValidationIssue(path, message));

    private static string Quoted(IEnumerable<string> words) => string.Join(", ", words.Select(w => $"\"{w}\""));

    /// <summary>What a field of this unit takes, in words, with an example of the text form.</summary>
    private static string DescribeUnit(string unit) => unit switch
    {
        "H" => "a number in henries (H), or text such as \"4.7 uH\"",
        "F" => "a number in farads (F), or text such as \"22 uF\"",
        "Hz" => "a number in hertz (Hz), or text such as \"500 kHz\"",
        "V" => "a number in volts (V), or text such as \"3.3 V\"",
        "A" => "a number in amperes (A), or text such as \"500 mA\"",
        "Ohm" => "a number in ohms (Ohm), or text such as \"10 mOhm\" or \"4.7k\"",
        "s" => "a number in seconds (s), or text such as \"50 ns\"",
        "A/s" => "a number in amperes per second (A/s), or text such as \"10 MA/s\"",
        "deg" => "a number in degrees (deg), or text such as \"45 deg\"",
        "dB" => "a number in decibels (dB), or text such as \"10 dB\"",
        "%" => "a number in percent (%), or text such as \"5 %\"",
        "V/V" => "a number in volts per volt (V/V), or text such as \"50m\"",
        _ => "a plain number without unit, or text with an SI prefix such as \"10k\"",
    };

    private static string Describe(JsonElement e) => e.ValueKind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => $"the text \"{e.GetString()}\"",
        JsonValueKind.Number => $"the number {e.GetRawText()}",
        JsonValueKind.True => "true",
        JsonValueKind.False => "false",
        JsonValueKind.Null => "null",
        _ => "nothing",
    };
}
