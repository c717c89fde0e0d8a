using System.Collections.Immutable;
using System.Text.Json;
using System.Text.Json.Nodes;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli.Tests;

/// <summary>The design file's "tolerances" section: round trip, defaults, every error with its JSON path, and its use by analyze and montecarlo.</summary>
public class TolerancesSectionTests
{
    private const string WithSection = "pol-12v-to-3v3-peak-current-mode.json";
    private const string Ceramic = "ceramic 47u 6.3V 1210";
    private const string Polymer = "polymer 220u 6.3V";

    [Fact]
    public void The_example_section_reads_as_written_in_the_file()
    {
        var t = Read(_ => { }).Design!.Tolerances!;
        Assert.Equal(20.0, t.InductancePct);
        Assert.Equal(20.0, t.CapacitancePct);
        Assert.Equal(1.0, t.DcBiasFactor);
        Assert.Equal(new CapacitorTolerance(10, 1), t.Capacitors[Ceramic]);
        Assert.Equal(new CapacitorTolerance(20, 1), t.Capacitors[Polymer]);
        Assert.Equal(2, t.Capacitors.Count);
        Assert.Equal(0.8, t.EsrLowFactor);
        Assert.Equal(2.0, t.EsrHighFactor);
        Assert.Equal(0.75, t.DcrLowFactor);
        Assert.Equal(1.4, t.DcrHighFactor);
        Assert.Equal(5.0, t.SenseGainPct);
        Assert.Equal(10.0, t.RampPct);
        Assert.Equal(15.0, t.TransconductancePct);
        Assert.DoesNotContain(DesignValidator.Validate(Read(_ => { }).Design!), i => i.Field.StartsWith("tolerances", StringComparison.Ordinal));
    }

    [Fact]
    public void A_design_without_the_section_has_none_and_writes_none_and_an_empty_one_takes_the_defaults()
    {
        var design = Read(j => j.AsObject().Remove("tolerances")).Design!;
        Assert.Null(design.Tolerances);
        Assert.DoesNotContain("\"tolerances\": {\n    \"inductancePct\"", DesignFile.Write(design), StringComparison.Ordinal);

        var empty = Read(j => j["tolerances"] = new JsonObject()).Design!.Tolerances!;
        Structural.AssertEqual(ToleranceSpec.Default, empty);
        var entry = Read(j => j["tolerances"] = new JsonObject { ["capacitors"] = new JsonArray(new JsonObject { ["label"] = Ceramic }) }).Design!.Tolerances!;
        Assert.Equal(new CapacitorTolerance(), entry.Capacitors[Ceramic]);
    }

    [Fact]
    public void Every_field_round_trips_bit_exactly()
    {
        var design = Read(_ => { }).Design!;
        var spec = new ToleranceSpec
        {
            InductancePct = 0.1 + 0.2,
            CapacitancePct = 1.0 / 3,
            DcBiasFactor = 0.7,
            Capacitors = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, [
                KeyValuePair.Create(Polymer, new CapacitorTolerance(12.5, 1)),
                KeyValuePair.Create(Ceramic, new CapacitorTolerance(10, 0.45 + 0.01)),
            ]),
            EsrLowFactor = 0.5,
            EsrHighFactor = 3.0 / 1.1,
            DcrLowFactor = 0.9,
            DcrHighFactor = 1.25,
            SenseGainPct = 2,
            RampPct = 7.5,
            TransconductancePct = 33,
        };
        var changed = design with { Tolerances = spec };
        string written = DesignFile.Write(changed);
        var back = DesignFile.Read(written);
        Assert.True(back.Errors.IsEmpty, string.Join("\n", back.Errors));
        Structural.AssertEqual(changed, back.Design);
        Assert.Equal(written, DesignFile.Write(back.Design!));
        // Entries are written in label order: the order the validator numbers them in.
        Assert.True(written.IndexOf(Ceramic, StringComparison.Ordinal) < written.IndexOf("\"label\": \"" + Polymer, StringComparison.Ordinal));
        Assert.Contains("\"inductancePct\": 0.30000000000000004", written, StringComparison.Ordinal);
    }

    [Fact]
    public void The_section_is_a_version_2_field()
    {
        var e = Errors(j =>
        {
            j["version"] = 1;
            j["plant"]!["control"] = new JsonObject { ["rampAmplitudeV"] = 1 };
            j["compensator"] = new JsonObject { ["form"] = "placement", ["type"] = "typeI", ["gain"] = new JsonObject { ["kind"] = "crossoverHz", ["value"] = 1e4 } };
        });
        Assert.Equal("is a field of design-file version 2; this file says \"version\": 1. Set \"version\": 2 to use it.", Single(e, "$.tolerances").Message);
        Assert.Single(e);
    }

    [Fact]
    public void Unknown_fields_wrong_types_and_a_repeated_label_name_their_path()
    {
        var e = Errors(j =>
        {
            j["tolerances"]!["inductorPct"] = 10;
            j["tolerances"]!["rampPct"] = "5 V";
            j["tolerances"]!["esrHighFactor"] = true;
            var caps = j["tolerances"]!["capacitors"]!.AsArray();
            caps[0]!["bias"] = 0.5;
            caps.Add(new JsonObject { ["label"] = Ceramic, ["tolerancePct"] = 5 });
            caps.Add(new JsonObject { ["tolerancePct"] = 5 });
        });
        Assert.StartsWith("is not a field of the tolerances; allowed fields: capacitancePct, capacitors, dcBiasFactor, dcrHighFactor,", Single(e, "$.tolerances.inductorPct").Message, StringComparison.Ordinal);
        Assert.StartsWith("expects a number in percent (%)", Single(e, "$.tolerances.rampPct").Message, StringComparison.Ordinal);
        Assert.StartsWith("must be a plain number", Single(e, "$.tolerances.esrHighFactor").Message, StringComparison.Ordinal);
        Assert.Equal("is not a field of a capacitor tolerance; allowed fields: dcBiasFactor, label, tolerancePct.", Single(e, "$.tolerances.capacitors[0].bias").Message);
        Assert.Equal($"'{Ceramic}' is given twice: one entry per output-capacitor branch label.", Single(e, "$.tolerances.capacitors[2].label").Message);
        Assert.Equal("is required: a text in quotes.", Single(e, "$.tolerances.capacitors[3].label").Message);
        Assert.Equal(6, e.Count);
    }

    [Theory]
    [InlineData("inductancePct", 95.0, "95.0 % is out of range: allowed 0 % to 90.0 %.")]
    [InlineData("capacitancePct", -1.0, "-1.00 % is out of range: allowed 0 % to 90.0 %.")]
    [InlineData("dcBiasFactor", 0.03, "0.03 is out of range: allowed 0.05 to 1.")]
    [InlineData("dcBiasFactor", 1.2, "1.2 is out of range: allowed 0.05 to 1.")]
    [InlineData("esrLowFactor", 0.05, "0.05 is out of range: allowed 0.1 to 1.")]
    [InlineData("esrLowFactor", 1.5, "1.5 is out of range: allowed 0.1 to 1.")]
    [InlineData("esrHighFactor", 0.9, "0.9 is out of range: allowed 1 to 10.")]
    [InlineData("esrHighFactor", 11.0, "11 is out of range: allowed 1 to 10.")]
    [InlineData("dcrLowFactor", 0.0, "0 is out of range: allowed 0.1 to 1.")]
    [InlineData("dcrHighFactor", 20.0, "20 is out of range: allowed 1 to 10.")]
    [InlineData("senseGainPct", 100.0, "100 % is out of range: allowed 0 % to 90.0 %.")]
    [InlineData("rampPct", -5.0, "-5.00 % is out of range: allowed 0 % to 90.0 %.")]
    [InlineData("transconductancePct", 91.0, "91.0 % is out of range: allowed 0 % to 90.0 %.")]
    public void Every_range_is_checked_with_the_field_named(string field, double value, string message)
    {
        var design = Read(j => j["tolerances"]![field] = value).Design!;
        var issue = Assert.Single(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
        Assert.Equal($"tolerances.{field}", issue.Field);
        Assert.Equal(message, issue.Message);
        Assert.Equal($"$.tolerances.{field}", IssueReport.From(issue).Path);
    }

    [Theory]
    [InlineData(0, "tolerancePct", 120.0, "120 % is out of range: allowed 0 % to 90.0 %.")]
    [InlineData(0, "dcBiasFactor", 0.0, "0 is out of range: allowed 0.05 to 1.")]
    [InlineData(1, "tolerancePct", -0.5, "-500 m% is out of range: allowed 0 % to 90.0 %.")]
    [InlineData(1, "dcBiasFactor", 1.01, "1.01 is out of range: allowed 0.05 to 1.")]
    public void A_capacitor_entry_out_of_range_is_named_by_its_index(int index, string field, double value, string message)
    {
        var design = Read(j => j["tolerances"]!["capacitors"]![index]![field] = value).Design!;
        var issue = Assert.Single(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
        Assert.Equal($"tolerances.capacitors[{index}].{field}", issue.Field);
        Assert.Equal(message, issue.Message);
    }

    [Fact]
    public void A_label_that_names_no_branch_is_an_error_listing_the_labels()
    {
        var design = Read(j => j["tolerances"]!["capacitors"]![1]!["label"] = "tantalum 100u").Design!;
        var issue = Assert.Single(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
        Assert.Equal("tolerances.capacitors[1].label", issue.Field);
        Assert.Equal($"'tantalum 100u' names no output-capacitor branch: the labels of plant.powerStage.outputCapacitors are '{Ceramic}', '{Polymer}'.", issue.Message);
    }

    [Fact]
    public async Task The_command_line_reports_a_range_error_of_the_section_with_exit_code_2()
    {
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example(WithSection)))!;
        j["tolerances"]!["inductancePct"] = 150;
        using var bad = new TempFile("bad.json", j.ToJsonString());
        foreach (string command in new[] { "analyze", "montecarlo" })
        {
            var run = await CliRun.Of(command, bad.Path);
            Assert.Equal(2, run.ExitCode);
            Assert.Contains("$.tolerances.inductancePct: 150 % is out of range: allowed 0 % to 90.0 %.", run.Error, StringComparison.Ordinal);
        }
    }

    /// <summary>
    /// The file's tolerances reach the corner table: with the example's own bands the "all low" corners differ from the
    /// nominal-parts corners; with every band of the file (and of the compensator's parts) tightened to 0 and the
    /// temperature multipliers to 1, the "all low", "all high" and worst-case corners are the nominal-parts corner, figure for figure.
    /// </summary>
    [Fact]
    public async Task Analyze_uses_the_file_tolerances_and_a_tightened_band_changes_the_corner_table()
    {
        var asIs = await CornerRows(RepoFiles.Example(WithSection));
        Assert.Equal(36, asIs.Count);
        Assert.NotEqual(asIs["Vin max, load min, nominal parts"].Phase, asIs["Vin max, load min, all low"].Phase);

        using var tight = new TempFile("tight.json", Tightened().ToJsonString());
        var rows = await CornerRows(tight.Path);
        Assert.Equal(36, rows.Count);
        foreach (string vin in new[] { "min", "nominal", "max" })
        {
            foreach (string load in new[] { "min", "nominal", "max" })
            {
                var nominal = rows[$"Vin {vin}, load {load}, nominal parts"];
                Assert.Equal(asIs[$"Vin {vin}, load {load}, nominal parts"], nominal);
                foreach (string set in new[] { "all low", "all high", "worst case" })
                {
                    Assert.Equal(nominal, rows[$"Vin {vin}, load {load}, {set}"]);
                }
            }
        }

        // Only the inductance band widened again: the all-low corners move once more.
        var j = Tightened();
        j["tolerances"]!["inductancePct"] = 30;
        using var lOnly = new TempFile("l-only.json", j.ToJsonString());
        var l = await CornerRows(lOnly.Path);
        Assert.NotEqual(l["Vin max, load min, nominal parts"].Crossover, l["Vin max, load min, all low"].Crossover);
    }

    [Fact]
    public async Task Montecarlo_uses_the_file_tolerances()
    {
        using var tight = new TempFile("tight.json", Tightened().ToJsonString());
        var run = await CliRun.Of("montecarlo", tight.Path, "--samples", "50", "--seed", "3");
        Assert.InRange(run.ExitCode, 0, 1);
        // Every band 0: every sample is the nominal design, so min and max of each figure coincide.
        var pm = run.Output.Split('\n').Single(l => l.StartsWith("phaseMarginDeg", StringComparison.Ordinal)).Split(' ', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(pm[1], pm[7]);
        var wide = await CliRun.Of("montecarlo", RepoFiles.Example(WithSection), "--samples", "50", "--seed", "3");
        var pmWide = wide.Output.Split('\n').Single(l => l.StartsWith("phaseMarginDeg", StringComparison.Ordinal)).Split(' ', StringSplitOptions.RemoveEmptyEntries);
        Assert.NotEqual(pmWide[1], pmWide[7]);
    }

    /// <summary>The example with every tolerance of the file 0 %, every multiplier 1 and the compensator's parts at 0 %.</summary>
    private static JsonNode Tightened()
    {
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example(WithSection)))!;
        j["tolerances"] = new JsonObject
        {
            ["inductancePct"] = 0,
            ["capacitancePct"] = 0,
            ["capacitors"] = new JsonArray(new JsonObject { ["label"] = Ceramic, ["tolerancePct"] = 0 }, new JsonObject { ["label"] = Polymer, ["tolerancePct"] = 0 }),
            ["esrLowFactor"] = 1,
            ["esrHighFactor"] = 1,
            ["dcrLowFactor"] = 1,
            ["dcrHighFactor"] = 1,
            ["senseGainPct"] = 0,
            ["rampPct"] = 0,
            ["transconductancePct"] = 0,
        };
        j["synthesis"] = new JsonObject { ["resistorTolerancePct"] = 0, ["capacitorTolerancePct"] = 0 };
        return j;
    }

    private static async Task<Dictionary<string, (double? Crossover, double? Phase, double? Gain)>> CornerRows(string path)
    {
        var run = await CliRun.Of("analyze", path, "--format", "json");
        Assert.InRange(run.ExitCode, 0, 1);
        using var doc = JsonDocument.Parse(run.Output);
        static double? N(JsonElement r, string name) => r.GetProperty(name).ValueKind == JsonValueKind.Number ? r.GetProperty(name).GetDouble() : null;
        return doc.RootElement.GetProperty("cornerTable").GetProperty("rows").EnumerateArray()
            .ToDictionary(r => r.GetProperty("label").GetString()!, r => (N(r, "crossoverHz"), N(r, "phaseMarginDeg"), N(r, "upperGainMarginDb")));
    }

    private static DesignFileResult Read(Action<JsonNode> change) => DesignFileEdits.Read(File.ReadAllText(RepoFiles.Example(WithSection)), change);

    private static List<ValidationIssue> Errors(Action<JsonNode> change) => DesignFileEdits.Errors(File.ReadAllText(RepoFiles.Example(WithSection)), change);

    private static ValidationIssue Single(List<ValidationIssue> errors, string path) => DesignFileEdits.OnlyAt(errors, path);
}
