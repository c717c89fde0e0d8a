using System.Collections.Immutable;
using System.Text.Json.Nodes;
using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli.Tests;

/// <summary>The design file's "synthesis" section: round trip, defaults, and every error with its JSON path.</summary>
public class SynthesisSectionTests
{
    private const string WithSection = "industrial-24v-to-5v.json";

    [Fact]
    public void The_example_section_reads_as_written_in_the_file()
    {
        var s = Read(_ => { }).Design!.Synthesis!;
        Assert.Null(s.R1Ohm);
        Assert.Equal(ESeries.E96, s.ResistorSeries);
        Assert.Equal(ESeries.E12, s.CapacitorSeries);
        Assert.Equal(1.0, s.ResistorTolerancePct);
        Assert.Equal(5.0, s.CapacitorTolerancePct);
        Assert.Equal(10.0, Assert.Single(s.TolerancesPct, t => t.Key == "C3").Value);
        Assert.Single(s.TolerancesPct);
        Assert.True(s.SearchNeighbours);
        Assert.Equal(2, s.SearchSteps);

        // The tolerances reach the synthesis options part by part.
        var o = s.ToOptions();
        Assert.Equal(10.0, o.ToleranceOf("C3", PartKind.Capacitor).TolerancePct);
        Assert.Equal(5.0, o.ToleranceOf("C1", PartKind.Capacitor).TolerancePct);
        Assert.Equal(1.0, o.ToleranceOf("R2", PartKind.Resistor).TolerancePct);
    }

    [Fact]
    public void A_design_without_the_section_has_none_and_writes_none()
    {
        var design = Read(j => j.AsObject().Remove("synthesis")).Design!;
        Assert.Null(design.Synthesis);
        Assert.DoesNotContain("\"synthesis\"", DesignFile.Write(design), StringComparison.Ordinal);

        // An empty section takes every default: the defaults of the documentation (docs/design-file.md).
        var empty = Read(j => j["synthesis"] = new JsonObject()).Design!.Synthesis!;
        Structural.AssertEqual(new SynthesisSettings(), empty);
        Assert.Equal(ESeries.E96, empty.ResistorSeries);
        Assert.Equal(ESeries.E12, empty.CapacitorSeries);
        Assert.True(empty.SearchNeighbours);
    }

    [Fact]
    public void Every_setting_round_trips_bit_exactly()
    {
        var design = Read(_ => { }).Design!;
        var settings = new SynthesisSettings
        {
            R1Ohm = 1e5 / 3,
            ResistorSeries = ESeries.E192,
            CapacitorSeries = ESeries.E6,
            ResistorTolerancePct = 0.1 + 0.2,
            CapacitorTolerancePct = 20,
            TolerancesPct = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new Dictionary<string, double> { ["R4"] = 0.5, ["C1"] = 10, ["C3"] = 1.0 / 3 }),
            SearchNeighbours = false,
            SearchSteps = 3,
        };
        var changed = design with { Synthesis = settings };
        string written = DesignFile.Write(changed);
        var back = DesignFile.Read(written);
        Assert.True(back.Errors.IsEmpty, string.Join("\n", back.Errors));
        Structural.AssertEqual(changed, back.Design);
        Assert.Equal(written, DesignFile.Write(back.Design!));
        Assert.Contains("\"resistorSeries\": \"E192\"", written, StringComparison.Ordinal);
        Assert.Contains("\"tolerances\": {\n      \"C1\": 10,\n      \"C3\": 0.3333333333333333,\n      \"R4\": 0.5\n    }", written, StringComparison.Ordinal);
    }

    [Fact]
    public void The_section_is_a_version_2_field()
    {
        var e = Errors(j => j["version"] = 1);
        Assert.Equal("is a field of design-file version 2; this file says \"version\": 1. Set \"version\": 2 to use it.", Single(e, "$.synthesis").Message);
        Assert.Single(e);
    }

    [Fact]
    public void Si_texts_are_read_in_the_section()
    {
        var s = Read(j =>
        {
            j["synthesis"]!["r1Ohm"] = "49.9 kOhm";
            j["synthesis"]!["tolerances"]!["C3"] = "10 %";
        }).Design!.Synthesis!;
        Assert.Equal(49.9e3, s.R1Ohm!.Value, 1e-9);
        Assert.Equal(10.0, s.TolerancesPct["C3"]);
    }

    [Theory]
    [InlineData("resistorSeries", "E7", "\"E7\" is not allowed here: use one of \"E24\", \"E48\", \"E96\", \"E192\".")]
    [InlineData("resistorSeries", "E6", "\"E6\" is not allowed here: use one of \"E24\", \"E48\", \"E96\", \"E192\".")]
    [InlineData("capacitorSeries", "E96", "\"E96\" is not allowed here: use one of \"E6\", \"E12\", \"E24\".")]
    [InlineData("capacitorSeries", "e12", "\"e12\" is not allowed here: use one of \"E6\", \"E12\", \"E24\".")]
    public void A_bad_series_word_is_an_error_at_its_path(string field, string word, string message)
    {
        var e = Errors(j => j["synthesis"]![field] = word);
        Assert.Equal(message, Single(e, $"$.synthesis.{field}").Message);
        Assert.Single(e);
    }

    [Fact]
    public void Unknown_fields_and_designators_inside_the_section_are_errors_with_their_path()
    {
        var e = Errors(j =>
        {
            j["synthesis"]!["seriesForResistors"] = "E96";
            j["synthesis"]!["tolerances"]!["Q1"] = 5;
        });
        Assert.StartsWith("is not a field of the synthesis settings; allowed fields: capacitorSeries, capacitorTolerancePct, r1Ohm, resistorSeries,", Single(e, "$.synthesis.seriesForResistors").Message, StringComparison.Ordinal);
        Assert.Equal("is not a field of the part tolerances; allowed fields: C1, C2, C3, R1, R2, R3, R4.", Single(e, "$.synthesis.tolerances.Q1").Message);
        Assert.Equal(2, e.Count);
    }

    [Fact]
    public void Wrong_types_and_units_in_the_section_name_the_path()
    {
        var e = Errors(j =>
        {
            j["synthesis"]!["r1Ohm"] = "10 pF";
            j["synthesis"]!["searchNeighbours"] = "yes";
            j["synthesis"]!["searchSteps"] = 1.5;
            j["synthesis"]!["tolerances"]!["C3"] = "10 V";
        });
        Assert.StartsWith("expects a number in ohms (Ohm)", Single(e, "$.synthesis.r1Ohm").Message, StringComparison.Ordinal);
        Assert.Equal("must be true or false; got the text \"yes\".", Single(e, "$.synthesis.searchNeighbours").Message);
        Assert.Equal("must be a whole number; got 1.5.", Single(e, "$.synthesis.searchSteps").Message);
        Assert.StartsWith("expects a number in percent (%)", Single(e, "$.synthesis.tolerances.C3").Message, StringComparison.Ordinal);
        Assert.Equal(4, e.Count);
        Assert.Equal("must be an object { ... }; got an array.", Single(Errors(j => j["synthesis"] = new JsonArray()), "$.synthesis").Message);
    }

    [Theory]
    [InlineData("resistorTolerancePct", 60.0, "60.0 % is out of range: allowed 0 % to 50.0 %.")]
    [InlineData("capacitorTolerancePct", -1.0, "-1.00 % is out of range: allowed 0 % to 50.0 %.")]
    [InlineData("searchSteps", 4.0, "4 is out of range: allowed 1 to 3.")]
    [InlineData("r1Ohm", 0.5, "500 mOhm is out of range: allowed 1.00 Ohm to 1.00 GOhm.")]
    public void Ranges_are_checked_by_the_validator_with_the_field_named(string field, double value, string message)
    {
        var design = Read(j => j["synthesis"]![field] = value).Design!;
        var issue = Assert.Single(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
        Assert.Equal($"synthesis.{field}", issue.Field);
        Assert.Equal(message, issue.Message);
        Assert.Equal($"$.synthesis.{field}", IssueReport.From(issue).Path);
    }

    [Fact]
    public void A_part_tolerance_out_of_range_is_an_error_and_one_for_a_missing_part_a_warning()
    {
        var design = Read(j =>
        {
            j["synthesis"]!["tolerances"]!["C3"] = 75;
            j["compensator"]!["type"] = "typeII";
            j["compensator"]!.AsObject().Remove("zero2Hz");
            j["compensator"]!.AsObject().Remove("pole2Hz");
        }).Design!;
        var issues = DesignValidator.Validate(design);
        var error = Assert.Single(issues, i => i.Severity == Severity.Error);
        Assert.Equal("synthesis.tolerances.C3", error.Field);
        Assert.Equal("75.0 % is out of range: allowed 0 % to 50.0 %.", error.Message);
        var warning = Assert.Single(issues, i => i.Severity == Severity.Warning && i.Field == "synthesis.tolerances.C3");
        Assert.Equal("a TypeII network has no C3; its tolerance is not used.", warning.Message);
    }

    [Fact]
    public void A_designator_given_in_code_that_no_network_has_is_an_error()
    {
        var design = Read(_ => { }).Design!;
        var odd = design with { Synthesis = design.Synthesis! with { TolerancesPct = design.Synthesis.TolerancesPct.Add("L1", 5) } };
        var issue = Assert.Single(DesignValidator.Validate(odd), i => i.Severity == Severity.Error);
        Assert.Equal("synthesis.tolerances.L1", issue.Field);
        Assert.StartsWith("'L1' is not a part of an op-amp network", issue.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_command_line_reports_section_errors_with_the_file_and_path_and_exit_code_2()
    {
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example(WithSection)))!;
        j["synthesis"]!["capacitorSeries"] = "E48";
        j["synthesis"]!["searchSteps"] = 7;
        using var bad = new TempFile("bad.json", j.ToJsonString());
        foreach (string command in new[] { "synthesize", "analyze" })
        {
            var run = await CliRun.Of(command, bad.Path);
            Assert.Equal(2, run.ExitCode);
            Assert.Equal(string.Empty, run.Output);
            Assert.Contains($"{bad.Path}: error: $.synthesis.capacitorSeries: \"E48\" is not allowed here", run.Error, StringComparison.Ordinal);
        }

        j["synthesis"]!["capacitorSeries"] = "E24";
        File.WriteAllText(bad.Path, j.ToJsonString());
        var range = await CliRun.Of("synthesize", bad.Path);
        Assert.Equal(2, range.ExitCode);
        Assert.Contains($"{bad.Path}: error: $.synthesis.searchSteps: 7 is out of range: allowed 1 to 3.", range.Error, StringComparison.Ordinal);
    }

    private static DesignFileResult Read(Action<JsonNode> change) => DesignFileEdits.Read(File.ReadAllText(RepoFiles.Example(WithSection)), change);

    private static List<ValidationIssue> Errors(Action<JsonNode> change) => DesignFileEdits.Errors(File.ReadAllText(RepoFiles.Example(WithSection)), change);

    private static ValidationIssue Single(List<ValidationIssue> errors, string path) => DesignFileEdits.OnlyAt(errors, path);
}
