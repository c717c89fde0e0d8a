using System.Collections;
using System.Reflection;

namespace LoopShaper.Cli.Tests;

/// <summary>
/// Value-by-value comparison of design records. Record equality compares ImmutableArray fields by reference, so a
/// read-back design never equals the original with ==; this walks every public property instead.
/// </summary>
internal static class Structural
{
    public static void AssertEqual(object? expected, object? actual, string path = "design")
    {
        if (expected is null || actual is null)
        {
            Assert.True(expected is null && actual is null, $"{path}: {Show(expected)} vs {Show(actual)}");
            return;
        }

        Assert.True(expected.GetType() == actual.GetType(), $"{path}: type {expected.GetType().Name} vs {actual.GetType().Name}");
        switch (expected)
        {
            case double e:
                double a = (double)actual;
                // Bit-exact: a round trip must not lose a single ulp (-0 and +0 are the same value).
                Assert.True(e.Equals(a), $"{path}: {e:R} vs {a:R}");
                return;
            case string or bool or int or Enum:
                Assert.True(expected.Equals(actual), $"{path}: {Show(expected)} vs {Show(actual)}");
                return;
            case IEnumerable e when expected is not string:
                var ex = e.Cast<object?>().ToList();
                var ac = ((IEnumerable)actual).Cast<object?>().ToList();
                Assert.True(ex.Count == ac.Count, $"{path}: {ex.Count} items vs {ac.Count}");
                for (int i = 0; i < ex.Count; i++)
                {
                    AssertEqual(ex[i], ac[i], $"{path}[{i}]");
                }

                return;
        }

        var type = expected.GetType();
        if (Nullable.GetUnderlyingType(type) is not null || type.IsPrimitive)
        {
            Assert.Equal(expected, actual);
            return;
        }

        foreach (var p in type.GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.GetIndexParameters().Length == 0))
        {
            AssertEqual(p.GetValue(expected), p.GetValue(actual), $"{path}.{p.Name}");
        }
    }

    private static string Show(object? o) => o switch
    {
        null => "null",
        double d => d.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
        _ => o.ToString() ?? string.Empty,
    };
}
