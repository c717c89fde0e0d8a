using System.Collections.Immutable;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Design;

/// <summary>Reads the design file's optional "synthesis" section (docs/design-file.md) into <see cref="SynthesisSettings"/>.</summary>
internal static class SynthesisSectionReader
{
    /// <summary>synthesis.resistorSeries: the series resistors are offered in.</summary>
    public static readonly IReadOnlyList<(string Word, ESeries Value)> ResistorSeriesWords =
        [.. SynthesisOptions.ResistorSeriesAllowed.Select(s => (s.ToString(), s))];

    /// <summary>synthesis.capacitorSeries: the series capacitors are offered in.</summary>
    public static readonly IReadOnlyList<(string Word, ESeries Value)> CapacitorSeriesWords =
        [.. SynthesisOptions.CapacitorSeriesAllowed.Select(s => (s.ToString(), s))];

    public static SynthesisSettings Read(JsonFieldReader s)
    {
        var d = new SynthesisSettings();
        var settings = new SynthesisSettings
        {
            R1Ohm = s.NullableNumber("r1Ohm", "Ohm"),
            ResistorSeries = s.Word("resistorSeries", ResistorSeriesWords, d.ResistorSeries),
            CapacitorSeries = s.Word("capacitorSeries", CapacitorSeriesWords, d.CapacitorSeries),
            ResistorTolerancePct = s.Number("resistorTolerancePct", "%", d.ResistorTolerancePct),
            CapacitorTolerancePct = s.Number("capacitorTolerancePct", "%", d.CapacitorTolerancePct),
            TolerancesPct = Tolerances(s.OptionalObject("tolerances")) ?? d.TolerancesPct,
            SearchNeighbours = s.Boolean("searchNeighbours", d.SearchNeighbours),
            SearchSteps = s.Integer("searchSteps", d.SearchSteps),
        };
        s.Finish("the synthesis settings");
        return settings;
    }

    /// <summary>One optional tolerance per designator; any other name is an unknown field.</summary>
    private static ImmutableSortedDictionary<string, double>? Tolerances(JsonFieldReader? t)
    {
        if (t is null)
        {
            return null;
        }

        var tolerances = ImmutableSortedDictionary.CreateBuilder<string, double>(StringComparer.Ordinal);
        foreach (string designator in SynthesisSettings.Designators)
        {
            if (t.NullableNumber(designator, "%") is double pct)
            {
                tolerances[designator] = pct;
            }
        }

        t.Finish("the part tolerances");
        return tolerances.ToImmutable();
    }
}
