using System.Text.Json;
using System.Text.Json.Nodes;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Cli.Tests;

/// <summary>`synthesize` in-process on the committed examples: exit codes, the parts table, the series options, the re-analysis.</summary>
public class SynthesizeCommandTests
{
    [Theory]
    [MemberData(nameof(OpAmpExamples))]
    public async Task Every_op_amp_example_synthesises_and_its_exit_code_is_what_analyze_says_of_the_built_design(string example)
    {
        var run = await CliRun.Of("synthesize", RepoFiles.Example(example), "--format", "json");
        Assert.True(run.Error.Length == 0, run.Error);
        using var doc = JsonDocument.Parse(run.Output);
        var r = doc.RootElement;
        Assert.Equal("loopshaper-synthesis", r.GetProperty("format").GetString());
        Assert.Equal(run.ExitCode == 0, r.GetProperty("meetsCriteria").GetBoolean());

        // Cross-check: the design file written with the chosen parts, analysed by `analyze`, gives the same verdict.
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example))).Design!;
        var built = DesignSynthesizer.WithParts(design, NetworkOf(r, Enum.Parse<CompensatorType>(r.GetProperty("compensatorType").GetString()!, ignoreCase: true)));
        using var file = new TempFile("built.json", DesignFile.Write(built));
        Assert.Equal(await MeetsCriteriaAtOperatingPoint(file.Path) ? 0 : 1, run.ExitCode);

        foreach (var p in r.GetProperty("parts").EnumerateArray())
        {
            double ideal = p.GetProperty("idealValue").GetDouble(), snapped = p.GetProperty("snappedValue").GetDouble(), chosen = p.GetProperty("chosenValue").GetDouble();
            Assert.True(StandardValues.TryParse(p.GetProperty("series").GetString(), out var series, out _));
            // Each value to build is a preferred value of its series (IEC 60063), the error is 100 (snapped - ideal) / ideal.
            Assert.True(StandardValues.IsPreferred(snapped, series), $"{p.GetProperty("designator")}: {snapped} not in {series}");
            Assert.True(StandardValues.IsPreferred(chosen, series), $"{p.GetProperty("designator")}: {chosen} not in {series}");
            Assert.Equal(100 * (snapped - ideal) / ideal, p.GetProperty("snappedErrorPct").GetDouble(), 1e-9);
            Assert.Equal(100 * (chosen - ideal) / ideal, p.GetProperty("chosenErrorPct").GetDouble(), 1e-9);
            // Nearest in log distance over every decade of the series' table (IEC 60063), searched here by brute force.
            double nearest = Enumerable.Range(-15, 30).SelectMany(e => StandardValues.Decade(series).Select(m => m * Math.Pow(10, e))).MinBy(c => Math.Abs(Math.Log(ideal / c)));
            Assert.Equal(nearest, snapped, nearest * 1e-9);
        }
    }

    [Fact]
    public async Task The_text_report_shows_ideal_snapped_error_series_tolerance_role_and_the_loop_side_by_side()
    {
        var run = await CliRun.Of("synthesize", RepoFiles.Example("industrial-24v-to-5v.json"), "--no-search");
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        string[] lines = run.Output.Split('\n');
        Assert.Contains("  part  ideal         snapped       error     series  tol.   role", lines);
        // C3 carries the 10 % of the example's synthesis.tolerances; the others the section's defaults.
        Assert.Contains(lines, l => l.StartsWith("  C3    692.5 pF      680 pF        -1.80 %   E12     10 %   capacitor in series with R3", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("  R1    52.30 kOhm    52.3 kOhm     0.00 %    E96     1 %    input resistor and divider top", StringComparison.Ordinal));
        Assert.Contains("Loop with ideal and snapped parts", lines);
        Assert.Contains(lines, l => l.StartsWith("  crossover       30.0 kHz      ", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("  phase margin    ", StringComparison.Ordinal) && l.Contains(" deg", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("  gain margin     ", StringComparison.Ordinal) && l.Contains(" dB", StringComparison.Ordinal));
        Assert.Contains("Criteria with the chosen parts", lines);
        Assert.DoesNotContain("searched", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_ideal_parts_put_the_crossover_on_the_design_target()
    {
        // The industrial example sets its gain by a 30 kHz crossover target: the exact parts must reproduce it (|T| = 1
        // there by construction, Erickson & Maksimovic 2nd ed. sec. 9.5), within the crossover search's 1e-6 relative.
        using var doc = await Json("synthesize", RepoFiles.Example("industrial-24v-to-5v.json"));
        var r = doc.RootElement;
        Assert.Equal(30e3, r.GetProperty("targetCrossoverHz").GetDouble(), 1e-6);
        Assert.Equal(30e3, r.GetProperty("ideal").GetProperty("crossoverHz").GetDouble(), 30e3 * 1e-6);
        // The search keeps the crossover within 2 % and the phase margin within 1 deg of the ideal loop's (our search's
        // distance, common practice, no source; the example's result is 0.7 % and 0.3 deg).
        var searched = r.GetProperty("searched");
        Assert.InRange(searched.GetProperty("crossoverHz").GetDouble(), 30e3 * 0.98, 30e3 * 1.02);
        Assert.InRange(searched.GetProperty("phaseMarginDeg").GetDouble() - r.GetProperty("ideal").GetProperty("phaseMarginDeg").GetDouble(), -1.0, 1.0);
        Assert.True(r.GetProperty("searchCandidates").GetInt32() == 3125, "5 free parts of a Type III, +-2 steps each: 5^5 combinations");
    }

    [Fact]
    public async Task Series_options_change_the_chosen_values()
    {
        string example = RepoFiles.Example("industrial-24v-to-5v.json");
        using var e96 = await Json("synthesize", example, "--no-search");
        using var e24 = await Json("synthesize", example, "--no-search", "--series", "E24", "--cap-series", "E6");
        var a = Parts(e96);
        var b = Parts(e24);
        Assert.Equal(a.Keys.Order(), b.Keys.Order());
        // 52.3 kOhm is an E96 value and not an E24 one: R1 moves to 51 kOhm (IEC 60063 tables), and every ideal value
        // with it, R x k and C / k (the network's impedances scale together, Venable 1983).
        Assert.Equal(52.3e3, a["R1"].Chosen, 1e-6);
        Assert.Equal(51e3, b["R1"].Chosen, 1e-6);
        double k = 51.0 / 52.3;
        foreach (var (d, p) in b.Where(p => p.Key != "R1"))
        {
            double scaled = d.StartsWith('R') ? a[d].Ideal * k : a[d].Ideal / k;
            Assert.Equal(scaled, p.Ideal, scaled * 1e-9);
        }

        foreach (var (d, p) in b)
        {
            Assert.Equal(d.StartsWith('R') ? "E24" : "E6", p.Series);
            Assert.True(StandardValues.IsPreferred(p.Chosen, d.StartsWith('R') ? ESeries.E24 : ESeries.E6));
        }

        Assert.Equal(18.7e3, a["R2"].Chosen, 1e-6);
        Assert.Equal(18e3, b["R2"].Chosen, 1e-6);
        Assert.Equal(1.15e3, a["R3"].Chosen, 1e-9);
        Assert.Equal(1.1e3, b["R3"].Chosen, 1e-9);
        // Coarser series, larger snapping errors: E24 steps are about 10 %, E96 about 2.4 % (IEC 60063).
        Assert.True(b.Where(p => p.Key.StartsWith('R')).Max(p => Math.Abs(p.Value.ErrorPct)) > a.Where(p => p.Key.StartsWith('R')).Max(p => Math.Abs(p.Value.ErrorPct)));
        Assert.All(a.Where(p => p.Key.StartsWith('R')), p => Assert.InRange(Math.Abs(p.Value.ErrorPct), 0, 1.25));
    }

    [Fact]
    public async Task R1_scales_every_impedance()
    {
        // Gc = Zf / Zin is unchanged when every impedance scales by k: R x k, C / k (Venable 1983 network formulas).
        string example = RepoFiles.Example("industrial-24v-to-5v.json");
        using var base_ = await Json("synthesize", example, "--no-search");
        using var scaled = await Json("synthesize", example, "--no-search", "--r1", "20 kOhm");
        var a = Parts(base_);
        var b = Parts(scaled);
        double k = 20e3 / 52.3e3;
        Assert.Equal(20e3, b["R1"].Chosen, 1e-9);
        foreach (string d in new[] { "R2", "R3", "R4" })
        {
            Assert.Equal(a[d].Ideal * k, b[d].Ideal, a[d].Ideal * k * 1e-9);
        }

        foreach (string d in new[] { "C1", "C2", "C3" })
        {
            Assert.Equal(a[d].Ideal / k, b[d].Ideal, a[d].Ideal / k * 1e-9);
        }
    }

    [Fact]
    public async Task No_search_keeps_the_snapped_values()
    {
        using var doc = await Json("synthesize", RepoFiles.Example("industrial-24v-to-5v.json"), "--no-search");
        var r = doc.RootElement;
        Assert.False(r.GetProperty("searchNeighbours").GetBoolean());
        Assert.Equal(JsonValueKind.Null, r.GetProperty("searched").ValueKind);
        Assert.All(r.GetProperty("parts").EnumerateArray(), p => Assert.Equal(p.GetProperty("snappedValue").GetDouble(), p.GetProperty("chosenValue").GetDouble()));
    }

    [Fact]
    public async Task Exit_code_1_when_the_snapped_loop_misses_a_criterion_the_ideal_one_meets()
    {
        // Snapped to E96/E12 without the search, the industrial loop has 62.9 deg of phase margin against the ideal
        // 64.5 deg: a 63.5 deg limit separates them.
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json")))!;
        j["criteria"]!["minPhaseMarginDeg"] = 63.5;
        using var file = new TempFile("tight.json", j.ToJsonString());
        var run = await CliRun.Of("synthesize", file.Path, "--no-search", "--format", "json");
        Assert.Equal(1, run.ExitCode);
        using var doc = JsonDocument.Parse(run.Output);
        var r = doc.RootElement;
        Assert.True(r.GetProperty("ideal").GetProperty("phaseMarginDeg").GetDouble() > 63.5);
        Assert.True(r.GetProperty("snapped").GetProperty("phaseMarginDeg").GetDouble() < 63.5);
        var pm = Assert.Single(r.GetProperty("criteria").EnumerateArray(), c => c.GetProperty("path").GetString() == "$.criteria.minPhaseMarginDeg");
        Assert.False(pm.GetProperty("passed").GetBoolean());
        Assert.True(await MeetsCriteriaAtOperatingPoint(file.Path));

        var text = await CliRun.Of("synthesize", file.Path, "--no-search");
        Assert.Equal(1, text.ExitCode);
        Assert.Contains("  FAIL  phase margin", text.Output, StringComparison.Ordinal);
        Assert.Contains("does NOT meet every criterion", text.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Search_steps_set_the_width_of_the_neighbour_search()
    {
        // The search scores every combination of +-N preferred-value steps of each free part (R1 and R4 fixed):
        // (2N + 1)^m combinations for m free parts, so N = 1 and N = 3 give 3^m and 7^m with the same m.
        string example = RepoFiles.Example("usb-5v-to-3v3-diode.json");
        using var one = await Json("synthesize", example, "--search-steps", "1");
        using var three = await Json("synthesize", example, "--search-steps", "3");
        Assert.Equal(1, one.RootElement.GetProperty("searchSteps").GetInt32());
        Assert.Equal(3, three.RootElement.GetProperty("searchSteps").GetInt32());
        int c1 = one.RootElement.GetProperty("searchCandidates").GetInt32(), c3 = three.RootElement.GetProperty("searchCandidates").GetInt32();
        int m = (int)Math.Round(Math.Log(c1) / Math.Log(3));
        Assert.InRange(m, 1, 6);
        Assert.Equal((int)Math.Pow(3, m), c1);
        Assert.Equal((int)Math.Pow(7, m), c3);

        // The same option on export steers the parts it writes; the design file's synthesis.searchSteps is the default.
        var exported = await CliRun.Of("export", example, "--parts", "--search-steps", "1");
        Assert.Equal(0, exported.ExitCode);
        var parts = PartsListCsv.Parse(exported.Output).ToDictionary(p => p.Designator);
        foreach (var p in one.RootElement.GetProperty("parts").EnumerateArray())
        {
            Assert.Equal(p.GetProperty("chosenValue").GetDouble(), parts[p.GetProperty("designator").GetString()!].Value, 1e-9 * p.GetProperty("chosenValue").GetDouble());
        }

        var j = JsonNode.Parse(File.ReadAllText(example))!;
        j["version"] = 2;
        j["synthesis"] = new JsonObject { ["searchSteps"] = 1 };
        using var file = new TempFile("steps.json", j.ToJsonString());
        using var fromFile = await Json("synthesize", file.Path);
        Assert.Equal(c1, fromFile.RootElement.GetProperty("searchCandidates").GetInt32());
    }

    [Fact]
    public async Task Impractical_values_are_warned()
    {
        // The 72 V rail's 140 kOhm R1 leaves C2 at 2.84 pF, below 10 pF (common practice, no source).
        using var doc = await Json("synthesize", RepoFiles.Example("battery-72v-to-12v-high-voltage.json"));
        Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.StartsWith("C2 = 2.70 pF is below 10 pF", StringComparison.Ordinal));
        using var lower = await Json("synthesize", RepoFiles.Example("battery-72v-to-12v-high-voltage.json"), "--r1", "14k");
        Assert.DoesNotContain(lower.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("below 10 pF", StringComparison.Ordinal));
    }

    [Fact]
    public async Task The_report_goes_to_the_out_file()
    {
        using var file = new TempFile("parts.txt");
        var run = await CliRun.Of("synthesize", RepoFiles.Example("usb-5v-to-3v3-diode.json"), "--out", file.Path);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.StartsWith("Design: USB-powered 5 V to 3.3 V rail", File.ReadAllText(file.Path), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("--series", "E7", "error: --series: 'E7' is not a series: allowed E6, E12, E24, E48, E96, E192 (IEC 60063). For resistors: E24, E48, E96, E192.")]
    [InlineData("--series", "E12", "error: --series: E12 is not offered for resistors: allowed E24, E48, E96, E192.")]
    [InlineData("--cap-series", "E192", "error: --cap-series: E192 is not offered for capacitors: allowed E6, E12, E24.")]
    [InlineData("--r1", "10q", "error: --r1: '10q' has an unknown prefix or a unit other than Ohm; allowed prefixes p n u m k M G.")]
    [InlineData("--r1", "10 kHz", "error: --r1: '10 kHz' has an unknown prefix or a unit other than Ohm; allowed prefixes p n u m k M G.")]
    [InlineData("--r1", "2G", "error: --r1: 2.00 GOhm is out of range: allowed 1.00 Ohm to 1.00 GOhm.")]
    [InlineData("--search-steps", "0", "error: --search-steps: 0 is out of range: allowed 1 to 3.")]
    [InlineData("--search-steps", "4", "error: --search-steps: 4 is out of range: allowed 1 to 3.")]
    [InlineData("--search-steps", "two", "error: --search-steps: 'two' is not a whole number: allowed 1 to 3.")]
    [InlineData("--search-steps", "1.5", "error: --search-steps: '1.5' is not a whole number: allowed 1 to 3.")]
    public async Task Bad_option_values_are_exit_code_2_with_the_option_named(string option, string value, string message)
    {
        var run = await CliRun.Of("synthesize", RepoFiles.Example("usb-5v-to-3v3-diode.json"), option, value);
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.Equal(message, run.Error.TrimEnd('\n'));
    }

    [Fact]
    public async Task A_placement_no_network_realises_is_exit_code_2()
    {
        // A Type II pole below its zero: no R2, C1, C2 give it (C2 = (C1 + C2) fz / fp would exceed C1 + C2).
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example("usb-5v-to-3v3-diode.json")))!;
        j["compensator"]!["pole1Hz"] = "1 kHz";
        using var file = new TempFile("pole-below-zero.json", j.ToJsonString());
        var run = await CliRun.Of("synthesize", file.Path);
        Assert.Equal(2, run.ExitCode);
        Assert.StartsWith($"{file.Path}: error: $.compensator: no op-amp network was synthesised: ", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task An_ota_compensator_is_synthesised_with_gm_fixed()
    {
        // The peak current-mode example has a transconductance (OTA) Type II compensator: R2, C1, C2 from its placement
        // with gm = 1 mS fixed, snapped, and the design analysed again with them.
        string example = RepoFiles.Example("pol-12v-to-3v3-peak-current-mode.json");
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        Assert.IsType<TransconductanceNetwork>(design.Compensator);
        Assert.True(DesignSynthesizer.TrySynthesizeOta(design, DesignSynthesizer.OptionsOf(design), out var expected, out _));
        var run = await CliRun.Of("synthesize", example);
        Assert.Equal(expected!.MeetsCriteria ? 0 : 1, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);

        using var doc = await Json("synthesize", example);
        var root = doc.RootElement;
        Assert.Equal("typeII", root.GetProperty("compensatorType").GetString());
        var designators = root.GetProperty("parts").EnumerateArray().Select(p => p.GetProperty("designator").GetString()!).ToArray();
        Assert.Equal(["R2", "C1", "C2"], designators);
        Assert.Equal(expected.MeetsCriteria, root.GetProperty("meetsCriteria").GetBoolean());
        // The report names the amplifier the network is for, in the JSON and in the text heading.
        Assert.Equal("ota", root.GetProperty("amplifier").GetString());
        Assert.Contains("Synthesis: Type II OTA (transconductance) network,", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("op-amp network", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task An_ota_synthesis_honours_the_search_options()
    {
        // The OTA network searches R2, C1 and C2 (gm and the divider fixed): 3 free parts, (2 steps + 1)^3 combinations.
        string example = RepoFiles.Example("pol-12v-to-3v3-peak-current-mode.json");
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        Assert.True(DesignSynthesizer.TrySynthesizeOta(design, DesignSynthesizer.OptionsOf(design) with { SearchSteps = 3 }, out var expected, out _));
        var search = expected!.Synthesis.Search!;

        using var wide = await Json("synthesize", example, "--search-steps", "3");
        var r = wide.RootElement;
        Assert.True(r.GetProperty("searchNeighbours").GetBoolean());
        Assert.Equal(3, r.GetProperty("searchSteps").GetInt32());
        Assert.True(r.GetProperty("searchCandidates").GetInt32() == 343, "3 free parts, +-3 steps each: 7^3 combinations");
        Assert.Equal(search.Performance.CrossoverHz!.Value, r.GetProperty("searched").GetProperty("crossoverHz").GetDouble(), 1e-9 * search.Performance.CrossoverHz.Value);
        Assert.Equal(search.Performance.PhaseMarginDeg!.Value, r.GetProperty("searched").GetProperty("phaseMarginDeg").GetDouble(), 1e-9);
        foreach (var (p, q) in r.GetProperty("parts").EnumerateArray().Zip(search.Parts))
        {
            Assert.Equal(q.Designator, p.GetProperty("designator").GetString());
            Assert.Equal(q.Value.Value, p.GetProperty("chosenValue").GetDouble(), 1e-12 * q.Value.Value);
        }

        Assert.Contains(r.GetProperty("derivations").EnumerateArray(), d => d.GetProperty("quantity").GetString() == "Neighbour search");
        var text = await CliRun.Of("synthesize", example, "--search-steps", "3");
        Assert.Contains("searched", text.Output, StringComparison.Ordinal);
        Assert.Contains("chosen", text.Output, StringComparison.Ordinal);

        using var off = await Json("synthesize", example, "--no-search");
        Assert.False(off.RootElement.GetProperty("searchNeighbours").GetBoolean());
        Assert.Equal(JsonValueKind.Null, off.RootElement.GetProperty("searched").ValueKind);
        Assert.DoesNotContain(off.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("neighbour search", StringComparison.Ordinal));
    }

    [Fact]
    public async Task The_criteria_are_judged_with_the_design_s_own_op_amp()
    {
        // The DCM sensor example names a finite-gain op-amp (A0 = 31.6k, GBW = 3 MHz): the built design keeps it.
        string example = RepoFiles.Example("sensor-24v-to-5v-light-load-dcm.json");
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        var given = Assert.IsType<OpAmpNetwork>(design.Compensator);
        Assert.False(given.HasIdealAmplifier);
        Assert.True(DesignSynthesizer.TrySynthesize(design, DesignSynthesizer.OptionsOf(design), out var result, out _));
        Assert.Equal(given.Amplifier, Assert.IsType<OpAmpNetwork>(result!.BuiltDesign.Compensator).Amplifier);
        using var file = new TempFile("built.json", DesignFile.Write(result.BuiltDesign));
        var run = await CliRun.Of("synthesize", example);
        Assert.Equal(await MeetsCriteriaAtOperatingPoint(file.Path) ? 0 : 1, run.ExitCode);
    }

    /// <summary>
    /// `analyze`'s verdict at the design's own operating point ("meetsCriteria"). `synthesize` judges the snapped loop
    /// there; `analyze`'s exit code also counts the corner table, which `synthesize` does not sweep.
    /// </summary>
    private static async Task<bool> MeetsCriteriaAtOperatingPoint(string path)
    {
        var analyze = await CliRun.Of("analyze", path, "--format", "json");
        Assert.NotEqual(2, analyze.ExitCode);
        using var doc = JsonDocument.Parse(analyze.Output);
        return doc.RootElement.GetProperty("meetsCriteria").GetBoolean();
    }

    public static TheoryData<string> OpAmpExamples()
    {
        var data = new TheoryData<string>();
        foreach (string e in Directory.GetFiles(RepoFiles.ExamplesDir, "*.json").Select(f => Path.GetFileName(f)).Order(StringComparer.Ordinal))
        {
            if (DesignFile.Read(File.ReadAllText(RepoFiles.Example(e))).Design!.Compensator is not TransconductanceNetwork)
            {
                data.Add(e);
            }
        }

        return data;
    }

    internal static async Task<JsonDocument> Json(params string[] args)
    {
        var run = await CliRun.Of([.. args, "--format", "json"]);
        Assert.True(run.ExitCode is 0 or 1, run.Error);
        return JsonDocument.Parse(run.Output);
    }

    internal static Dictionary<string, (double Ideal, double Chosen, double ErrorPct, string Series, double TolerancePct)> Parts(JsonDocument doc)
        => doc.RootElement.GetProperty("parts").EnumerateArray().ToDictionary(
            p => p.GetProperty("designator").GetString()!,
            p => (p.GetProperty("idealValue").GetDouble(), p.GetProperty("chosenValue").GetDouble(), p.GetProperty("chosenErrorPct").GetDouble(), p.GetProperty("series").GetString()!, p.GetProperty("tolerancePct").GetDouble()));

    /// <summary>The network of a synthesis report's chosen parts.</summary>
    internal static OpAmpNetwork NetworkOf(JsonElement report, CompensatorType type)
    {
        var v = report.GetProperty("parts").EnumerateArray().ToDictionary(p => p.GetProperty("designator").GetString()!, p => p.GetProperty("chosenValue").GetDouble());
        double Get(string d) => v.TryGetValue(d, out double x) ? x : 0.0;
        return new OpAmpNetwork(type, Get("R1"), Get("C1"), Get("R2"), Get("C2"), Get("R3"), Get("C3"), Get("R4"));
    }
}
