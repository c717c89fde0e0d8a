using System.Collections.Immutable;
using System.Globalization;
using System.Text.Json;

namespace LoopShaper.Library.Comparison;

/// <summary>The fields in which two design files differ, found by walking both JSON trees together.</summary>
public static class DesignFileDiff
{
    /// <summary>
    /// Every leaf (number, text, true/false, null, empty object or array) whose value differs, in A's field order with
    /// B's extra fields after; array elements by index. Numbers are equal when their double values are equal, so that
    /// "1e-6" and "0.000001" are the same field value.
    /// </summary>
    /// <exception cref="JsonException">Either text is not JSON.</exception>
    public static ImmutableArray<InputDifference> Compare(string jsonA, string jsonB)
    {
        using var a = JsonDocument.Parse(jsonA);
        using var b = JsonDocument.Parse(jsonB);
        var found = new List<InputDifference>();
        Walk("$", a.RootElement, b.RootElement, found);
        return [.. found];
    }

    private static void Walk(string path, JsonElement? a, JsonElement? b, List<InputDifference> found)
    {
        var kindA = a?.ValueKind;
        var kindB = b?.ValueKind;
        if (IsContainer(a) || IsContainer(b))
        {
            if (kindA is JsonValueKind.Object || kindB is JsonValueKind.Object)
            {
                if (kindA is JsonValueKind.Object or null && kindB is JsonValueKind.Object or null)
                {
                    var names = new List<string>();
                    AddNames(a, names);
                    AddNames(b, names);
                    foreach (string name in names)
                    {
                        Walk(path + "." + name, Property(a, name), Property(b, name), found);
                    }

                    return;
                }
            }
            else if (kindA is JsonValueKind.Array or null && kindB is JsonValueKind.Array or null)
            {
                int n = Math.Max(a?.GetArrayLength() ?? 0, b?.GetArrayLength() ?? 0);
                for (int i = 0; i < n; i++)
                {
                    Walk(path + "[" + i.ToString(CultureInfo.InvariantCulture) + "]", Item(a, i), Item(b, i), found);
                }

                return;
            }
        }

        if (!SameLeaf(a, b))
        {
            found.Add(new InputDifference(path, a?.GetRawText(), b?.GetRawText()));
        }
    }

    /// <summary>A non-empty object or array: walked into rather than compared whole.</summary>
    private static bool IsContainer(JsonElement? e) => e switch
    {
        { ValueKind: JsonValueKind.Object } o => o.EnumerateObject().Any(),
        { ValueKind: JsonValueKind.Array } x => x.GetArrayLength() > 0,
        _ => false,
    };

    private static void AddNames(JsonElement? e, List<string> names)
    {
        if (e is { ValueKind: JsonValueKind.Object } o)
        {
            foreach (var p in o.EnumerateObject())
            {
                if (!names.Contains(p.Name, StringComparer.Ordinal))
                {
                    names.Add(p.Name);
                }
            }
        }
    }

    private static JsonElement? Property(JsonElement? e, string name)
        => e is { ValueKind: JsonValueKind.Object } o && o.TryGetProperty(name, out var v) ? v : null;

    private static JsonElement? Item(JsonElement? e, int i)
        => e is { ValueKind: JsonValueKind.Array } x && i < x.GetArrayLength() ? x[i] : null;

    private static bool SameLeaf(JsonElement? a, JsonElement? b)
    {
        if (a is not JsonElement x || b is not JsonElement y)
        {
            return a is null && b is null;
        }

        if (x.ValueKind != y.ValueKind)
        {
            return false;
        }

        return x.ValueKind switch
        {
            JsonValueKind.Number => x.GetDouble() == y.GetDouble(),
            JsonValueKind.String => string.Equals(x.GetString(), y.GetString(), StringComparison.Ordinal),
            _ => string.Equals(x.GetRawText(), y.GetRawText(), StringComparison.Ordinal),
        };
    }
}
