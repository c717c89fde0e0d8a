using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>The parts list CSV: written, parsed back, and bad files rejected with the line and field.</summary>
public class PartsListCsvTests
{
    private static NetworkSynthesis Synthesis(bool search)
    {
        var plant = TestPlants.BuckPlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, 60e3, 45, null, 600e3));
        return NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { OutputVoltageV = 1.2, ReferenceV = 0.6, SearchNeighbours = search, ResistorSeries = ESeries.E192, CapacitorSeries = ESeries.E24 });
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Parts_list_parsed_back_gives_the_same_values(bool search)
    {
        var r = Synthesis(search);
        string csv = PartsListCsv.Write(r);
        Assert.StartsWith(PartsListCsv.Header + "\n", csv, StringComparison.Ordinal);
        var back = PartsListCsv.Parse(csv);
        var expected = r.ChosenParts.Select(PartsListEntry.From).ToArray();
        Assert.Equal(expected.Length, back.Length);
        for (int i = 0; i < expected.Length; i++)
        {
            // Exactly the same doubles: the value column is written round-trip.
            Assert.Equal(expected[i], back[i]);
        }

        Assert.Equal(7, back.Length);
        Assert.Equal(["R1", "R2", "C1", "C2", "R3", "C3", "R4"], back.Select(e => e.Designator).ToArray());
    }

    [Fact]
    public void Fields_with_commas_quotes_and_line_breaks_are_quoted_and_read_back()
    {
        var entries = new[]
        {
            new PartsListEntry("C7", PartKind.Capacitor, 2.2e-9, ESeries.E6, 10, "odd role, with a comma and a \"quote\"\nand a second line"),
            new PartsListEntry("R9", PartKind.Resistor, 12345.6789, null, 0.1, "not snapped"),
        };
        string csv = PartsListCsv.Write(entries);
        Assert.Contains("\"odd role, with a comma and a \"\"quote\"\"\nand a second line\"", csv, StringComparison.Ordinal);
        Assert.Equal(entries, PartsListCsv.Parse(csv).ToArray());
        Assert.Equal(entries, PartsListCsv.Parse(csv.Replace("\n", "\r\n", StringComparison.Ordinal)).Select(e => e with { Role = e.Role.Replace("\r", string.Empty, StringComparison.Ordinal) }).ToArray());
    }

    [Fact]
    public void Written_lines_read_as_an_engineer_expects()
    {
        var csv = PartsListCsv.Write([new PartsListEntry("C1", PartKind.Capacitor, 4.7e-9, ESeries.E12, 5, "integrator")]);
        Assert.Equal(PartsListCsv.Header + "\nC1,4.7E-09,F,4.70 nF,E12,5,integrator\n", csv);
    }

    [Theory]
    [InlineData("designator,value\nR1,1000\n", "line 1: the header must be")]
    [InlineData(PartsListCsv.Header + "\nR1,abc,Ohm,1k,E24,1,x\n", "line 2 (R1): value 'abc'")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,H,1k,E24,1,x\n", "unit 'H' is not Ohm or F")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,Ohm,2.2k,E24,1,x\n", "display '2.2k' does not agree")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,Ohm,1k,E100,1,x\n", "series 'E100' is not a series")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,Ohm,1k,E24,99,x\n", "tolerance_pct '99' is out of range")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,Ohm\n", "line 2: 3 fields, expected 7")]
    [InlineData(PartsListCsv.Header + "\nR1,1000,Ohm,1k,E24,1,\"open\n", "a quoted field is not closed")]
    public void Bad_files_are_rejected_with_the_line_and_field(string csv, string message)
    {
        Assert.False(PartsListCsv.TryParse(csv, out _, out var errors));
        Assert.Contains(errors, e => e.Contains(message, StringComparison.Ordinal));
        Assert.Throws<FormatException>(() => PartsListCsv.Parse(csv));
    }
}
