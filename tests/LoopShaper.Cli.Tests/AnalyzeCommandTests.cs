using System.Text.Json;
using LoopShaper.Core.Design;

namespace LoopShaper.Cli.Tests;

public class AnalyzeCommandTests
{
    [Theory]
    [MemberData(nameof(Examples))]
    public async Task Every_example_analyses_with_the_exit_code_of_its_criteria(string example)
    {
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example))).Design!;
        bool cornersPass = design.Plant is not LoopShaper.Core.PlantModels.BuckPlant || LoopShaper.Core.Corners.CornerSweep.Run(design).AllPass;
        var expected = DesignAnalyzer.Analyze(design).MeetsCriteria && cornersPass ? 0 : 1;
        var run = await CliRun.Of("analyze", RepoFiles.Example(example));
        Assert.Equal(expected, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        foreach (string section in new[] { "Gain crossovers", "Phase crossovers", "Margins", "delay margin", "closed loop", "Reference step", "Criteria", "Safety notice", DesignAnalysis.SafetyNotice })
        {
            Assert.Contains(section, run.Output, StringComparison.Ordinal);
        }
    }

    [Theory]
    [MemberData(nameof(Examples))]
    public async Task Json_output_parses_and_carries_unit_named_fields(string example)
    {
        var run = await CliRun.Of("analyze", RepoFiles.Example(example), "--format", "json");
        Assert.InRange(run.ExitCode, 0, 1);
        using var doc = JsonDocument.Parse(run.Output);
        var r = doc.RootElement;
        Assert.Equal("loopshaper-analysis", r.GetProperty("format").GetString());
        Assert.True(r.GetProperty("valid").GetBoolean());
        bool cornersPass = r.GetProperty("cornerTable").ValueKind == JsonValueKind.Null || r.GetProperty("cornerTable").GetProperty("allPass").GetBoolean();
        Assert.Equal(run.ExitCode == 0, r.GetProperty("meetsCriteria").GetBoolean() && cornersPass);
        var m = r.GetProperty("margins");
        foreach (string name in new[] { "crossoverHz", "phaseMarginDeg", "upperGainMarginDb", "lowerGainMarginDb", "delayMarginS", "closedLoopStable", "gainCrossovers", "phaseCrossovers" })
        {
            Assert.True(m.TryGetProperty(name, out _), $"margins.{name} missing");
        }

        Assert.Equal(JsonValueKind.Number, m.GetProperty("crossoverHz").ValueKind);
        Assert.Equal(JsonValueKind.Null, m.GetProperty("lowerGainMarginDb").ValueKind);
        Assert.All(m.GetProperty("gainCrossovers").EnumerateArray(), g => Assert.True(g.TryGetProperty("phaseMarginDeg", out _)));
        Assert.All(m.GetProperty("phaseCrossovers").EnumerateArray(), p => Assert.True(p.TryGetProperty("gainMarginDb", out _)));
        var step = r.GetProperty("referenceStep");
        Assert.True(step.TryGetProperty("overshootPct", out _));
        Assert.True(step.TryGetProperty("settlingTimeS", out _));
        Assert.Equal(DesignAnalysis.SafetyNotice, r.GetProperty("safetyNotice").GetString());
        Assert.NotEmpty(r.GetProperty("criteria").EnumerateArray());
        Assert.All(r.GetProperty("criteria").EnumerateArray(), c => Assert.StartsWith("$.criteria", c.GetProperty("path").GetString(), StringComparison.Ordinal));

        if (r.GetProperty("plantModel").GetString() == "buck")
        {
            var op = r.GetProperty("operatingPoint");
            Assert.InRange(op.GetProperty("dutyCycle").GetDouble(), 0.0, 1.0);
            Assert.True(op.GetProperty("rippleCurrentApp").GetDouble() > 0);
            Assert.True(r.GetProperty("loadStep").TryGetProperty("peakDeviationV", out _));
        }
        else
        {
            Assert.Equal(JsonValueKind.Null, r.GetProperty("operatingPoint").ValueKind);
        }

        Assert.DoesNotContain("NaN", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("Infinity", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Json_margins_of_the_custom_example_agree_with_the_scipy_reference()
    {
        // Reference: Reference/custom_boost_margins.py (SciPy brentq on the factor form, phase as the sum of factor
        // angles); both sides solve the crossings to far below the tolerance, which only covers the solvers' stopping rules.
        using var reference = JsonDocument.Parse(File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "Reference", "custom_boost_margins.json")));
        var run = await CliRun.Of("analyze", RepoFiles.Example("custom-boost-led-driver-rhp-zero.json"), "--format", "json");
        using var doc = JsonDocument.Parse(run.Output);
        var m = doc.RootElement.GetProperty("margins");
        var refGain = reference.RootElement.GetProperty("gainCrossovers").EnumerateArray().ToList();
        var gain = m.GetProperty("gainCrossovers").EnumerateArray().ToList();
        Assert.Equal(refGain.Count, gain.Count);
        for (int i = 0; i < gain.Count; i++)
        {
            Rel(refGain[i].GetProperty("frequencyHz").GetDouble(), gain[i].GetProperty("frequencyHz").GetDouble(), 1e-6);
            Assert.Equal(refGain[i].GetProperty("phaseMarginDeg").GetDouble(), gain[i].GetProperty("phaseMarginDeg").GetDouble(), 1e-4);
        }

        var refPhase = reference.RootElement.GetProperty("phaseCrossovers").EnumerateArray().ToList();
        var phase = m.GetProperty("phaseCrossovers").EnumerateArray().ToList();
        Assert.Equal(refPhase.Count, phase.Count);
        for (int i = 0; i < phase.Count; i++)
        {
            Rel(refPhase[i].GetProperty("frequencyHz").GetDouble(), phase[i].GetProperty("frequencyHz").GetDouble(), 1e-6);
            Assert.Equal(refPhase[i].GetProperty("criticalPhaseDeg").GetDouble(), phase[i].GetProperty("criticalPhaseDeg").GetDouble());
            Assert.Equal(refPhase[i].GetProperty("gainMarginDb").GetDouble(), phase[i].GetProperty("gainMarginDb").GetDouble(), 1e-4);
        }

        Rel(reference.RootElement.GetProperty("integratorHz").GetDouble(), doc.RootElement.GetProperty("compensator").GetProperty("integratorHz").GetDouble(), 1e-9);
    }

    [Fact]
    public async Task A_design_that_misses_a_criterion_exits_with_1_and_says_which()
    {
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example("core-rail-12v-to-1v0.json"))).Design!;
        var strict = design with { Criteria = design.Criteria with { MinPhaseMarginDeg = 80 } };
        using var file = new TempFile("strict.json", DesignFile.Write(strict));
        var run = await CliRun.Of("analyze", file.Path);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("FAIL  phase margin", run.Output, StringComparison.Ordinal);
        Assert.Contains("does NOT meet every criterion", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_broken_file_exits_with_2_and_names_every_field_on_stderr()
    {
        string json = File.ReadAllText(RepoFiles.Example("core-rail-12v-to-1v0.json"))
            .Replace("\"inductanceH\": \"330 nH\"", "\"inductanceH\": \"330 nF\"", StringComparison.Ordinal)
            .Replace("\"kind\": \"synchronous\"", "\"kind\": \"sync\"", StringComparison.Ordinal);
        using var file = new TempFile("broken.json", json);
        var run = await CliRun.Of("analyze", file.Path, "--format", "json");
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        var lines = run.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(2, lines.Length);
        Assert.StartsWith($"{file.Path}: error: $.plant.powerStage.inductor.inductanceH: expects a number in henries (H)", lines[0], StringComparison.Ordinal);
        Assert.StartsWith($"{file.Path}: error: $.plant.powerStage.rectifier.kind: ", lines[1], StringComparison.Ordinal);
    }

    [Fact]
    public async Task Values_out_of_range_exit_with_2_and_the_validator_message_as_a_json_path()
    {
        string json = File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json"))
            .Replace("\"switchingFrequencyHz\": \"400 kHz\"", "\"switchingFrequencyHz\": \"400 Hz\"", StringComparison.Ordinal);
        using var file = new TempFile("range.json", json);
        var run = await CliRun.Of("analyze", file.Path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("error: $.plant.powerStage.switchingFrequencyHz: 400 Hz is out of range: allowed 1.00 kHz to 100 MHz.", run.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_syntax_error_exits_with_2_and_gives_the_line()
    {
        using var file = new TempFile("syntax.json", "{\n  \"format\": \"loopshaper-design\"\n  \"version\": 1\n}\n");
        var run = await CliRun.Of("analyze", file.Path);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("error: $: JSON syntax error at line 3, column 3:", run.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("analyze", "no-such-file.json")]
    [InlineData("analyze")]
    [InlineData("analyze", "x.json", "--format", "xml")]
    [InlineData("analyse", "x.json")]
    [InlineData]
    public async Task Bad_command_lines_and_missing_files_exit_with_2(params string[] args)
    {
        var run = await CliRun.Of(args);
        Assert.Equal(2, run.ExitCode);
        Assert.NotEqual(string.Empty, run.Error);
        Assert.Equal(string.Empty, run.Output);
    }

    [Fact]
    public async Task Out_writes_the_report_to_a_file()
    {
        using var file = new TempFile("report.json");
        var run = await CliRun.Of("analyze", RepoFiles.Example("industrial-24v-to-5v.json"), "--format", "json", "--out", file.Path);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        using var doc = JsonDocument.Parse(File.ReadAllText(file.Path));
        Assert.Equal(30e3, doc.RootElement.GetProperty("margins").GetProperty("crossoverHz").GetDouble(), 1e-3);
    }

    [Fact]
    public async Task Help_exits_with_0()
    {
        var run = await CliRun.Of("--help");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("analyze", run.Output, StringComparison.Ordinal);
        Assert.Contains("bode", run.Output, StringComparison.Ordinal);
    }

    public static TheoryData<string> Examples() => RepoFiles.Examples();

    private static void Rel(double expected, double actual, double tolerance)
        => Assert.True(Math.Abs(actual - expected) <= tolerance * Math.Abs(expected), $"expected {expected:R}, got {actual:R} (relative tolerance {tolerance})");
}
