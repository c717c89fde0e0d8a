using System.Text.Json;
using System.Text.Json.Nodes;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Cli.Tests;

/// <summary>`suggest` in-process: K-factor and resonance placements with their derivation, --write, exit codes.</summary>
public class SuggestCommandTests
{
    private static string Industrial => RepoFiles.Example("industrial-24v-to-5v.json");

    [Fact]
    public async Task K_factor_type_III_follows_Venable_and_the_written_design_meets_the_target()
    {
        using var saved = new TempFile("suggested.json");
        var run = await CliRun.Of("suggest", Industrial, "--crossover", "40k", "--phase-margin", "55", "--type", "typeIII", "--format", "json", "--write", saved.Path);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        using var doc = JsonDocument.Parse(run.Output);
        var r = doc.RootElement;
        Assert.Equal("loopshaper-placement", r.GetProperty("format").GetString());
        Assert.Equal("kFactor", r.GetProperty("method").GetString());
        Assert.Equal(40e3, r.GetProperty("targetCrossoverHz").GetDouble(), 1e-6);

        // Venable 1983: boost = PM - 90 - plant phase; K = tan^2(boost/4 + 45 deg); double zero at fc / sqrt(K), double pole at fc sqrt(K).
        double boost = 55 - 90 - r.GetProperty("plantPhaseDeg").GetDouble();
        Assert.Equal(boost, r.GetProperty("requiredBoostDeg").GetDouble(), 1e-9);
        double k = Math.Pow(Math.Tan(((boost / 4) + 45) * Math.PI / 180), 2);
        Assert.Equal(k, r.GetProperty("k").GetDouble(), k * 1e-12);
        var c = r.GetProperty("compensator");
        Assert.Equal("typeIII", c.GetProperty("type").GetString());
        Assert.Equal(40e3 / Math.Sqrt(k), c.GetProperty("zero1Hz").GetDouble(), 1e-6);
        Assert.Equal(40e3 / Math.Sqrt(k), c.GetProperty("zero2Hz").GetDouble(), 1e-6);
        Assert.Equal(40e3 * Math.Sqrt(k), c.GetProperty("pole1Hz").GetDouble(), 1e-5);
        Assert.Equal(40e3 * Math.Sqrt(k), c.GetProperty("pole2Hz").GetDouble(), 1e-5);
        Assert.Equal(55.0, r.GetProperty("expectedPhaseMarginDeg").GetDouble(), 1e-6);
        Assert.True(r.GetProperty("derivations").GetArrayLength() >= 6);
        Assert.All(r.GetProperty("derivations").EnumerateArray(), d => Assert.False(string.IsNullOrEmpty(d.GetProperty("source").GetString())));

        // The saved design analysed in full: crossover on target and phase margin within 0.1 deg (issue 5), before snapping.
        var design = DesignFile.Read(File.ReadAllText(saved.Path)).Design!;
        var placement = Assert.IsType<CompensatorPlacement>(design.Compensator);
        Assert.Equal(GainSettingKind.IntegratorHz, placement.Gain.Kind);
        var analyze = await CliRun.Of("analyze", saved.Path, "--format", "json");
        using var a = JsonDocument.Parse(analyze.Output);
        var m = a.RootElement.GetProperty("margins");
        Assert.Equal(40e3, m.GetProperty("crossoverHz").GetDouble(), 40e3 * 1e-4);
        Assert.Equal(55.0, m.GetProperty("phaseMarginDeg").GetDouble(), 0.1);
    }

    [Fact]
    public async Task Text_output_lists_every_derivation_step_with_its_source()
    {
        var run = await CliRun.Of("suggest", Industrial, "--crossover", "40 kHz", "--phase-margin", "55 deg");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("Suggested placement: K factor (Venable 1983), Type III", run.Output, StringComparison.Ordinal);
        Assert.Contains("  1. Plant phase at the crossover", run.Output, StringComparison.Ordinal);
        Assert.Contains("       K = tan^2(boost/4 + 45 deg)", run.Output, StringComparison.Ordinal);
        Assert.Contains("       (Venable 1983 (K factor))", run.Output, StringComparison.Ordinal);
        Assert.Contains("  expected phase margin       55.00 deg", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Defaults_are_a_tenth_of_the_switching_frequency_and_the_criteria_phase_margin()
    {
        using var doc = await SynthesizeCommandTests.Json("suggest", Industrial);
        var r = doc.RootElement;
        // 400 kHz / 10 (common practice, no source) and criteria.minPhaseMarginDeg = 45 in the example.
        Assert.Equal(40e3, r.GetProperty("targetCrossoverHz").GetDouble(), 1e-6);
        Assert.Equal(45.0, r.GetProperty("targetPhaseMarginDeg").GetDouble());
        Assert.Equal(400e3, r.GetProperty("switchingFrequencyHz").GetDouble());
    }

    [Fact]
    public async Task Resonance_puts_the_double_zero_at_the_LC_resonance_and_a_pole_at_half_the_switching_frequency()
    {
        using var doc = await SynthesizeCommandTests.Json("suggest", Industrial, "--method", "resonance");
        var r = doc.RootElement;
        Assert.Equal("voltageModeResonance", r.GetProperty("method").GetString());
        var c = r.GetProperty("compensator");
        Assert.Equal("typeIII", c.GetProperty("type").GetString());
        Assert.Equal(200e3, c.GetProperty("pole2Hz").GetDouble());
        Assert.Equal(c.GetProperty("zero1Hz").GetDouble(), c.GetProperty("zero2Hz").GetDouble());
        // f0 = 1 / (2 pi sqrt(L C)) (Erickson & Maksimovic 2nd ed. sec. 8.2) with L = 10 uH, C = 3 x 12 uF + 100 uF; the
        // losses and the load move the pole pair of the full model by about 1.5 %, hence 3 %.
        var stage = ((BuckPlant)DesignFile.Read(File.ReadAllText(Industrial)).Design!.Plant).PowerStage;
        double f0 = 1 / (2 * Math.PI * Math.Sqrt(stage.Inductor.InductanceH * stage.OutputCapacitors.Sum(b => b.TotalCapacitanceF)));
        Assert.Equal(4315.7, f0, 0.1);
        Assert.InRange(c.GetProperty("zero1Hz").GetDouble(), f0 * 0.97, f0 * 1.03);
        // The first pole cancels the ESR zero of the polymer branch, 1 / (2 pi 25 mOhm 100 uF) = 63.7 kHz, moved a little
        // by the parallel ceramics; it lies between the resonance and fs/2.
        Assert.InRange(c.GetProperty("pole1Hz").GetDouble(), 55e3, 75e3);
    }

    [Fact]
    public async Task Resonance_on_a_custom_plant_with_type_II_is_the_current_mode_placement()
    {
        // A current-mode-like plant of our own: load pole at 300 Hz, ESR zero at 25 kHz, fs = 200 kHz. The Type II
        // zero goes to the load pole and its pole to the ESR zero, which lies below fs/2 (common practice, no source).
        var j = JsonNode.Parse(File.ReadAllText(RepoFiles.Example("custom-boost-led-driver-rhp-zero.json")))!;
        j["plant"]!["zeros"] = new JsonArray(new JsonObject { ["frequencyHz"] = "25 kHz" });
        j["plant"]!["poles"] = new JsonArray(new JsonObject { ["frequencyHz"] = "300 Hz" });
        using var file = new TempFile("current-mode-like.json", j.ToJsonString());
        using var doc = await SynthesizeCommandTests.Json("suggest", file.Path, "--method", "resonance", "--type", "typeII", "--crossover", "5k");
        var r = doc.RootElement;
        Assert.Equal("currentModeResonance", r.GetProperty("method").GetString());
        var c = r.GetProperty("compensator");
        Assert.Equal("typeII", c.GetProperty("type").GetString());
        Assert.Equal(300.0, c.GetProperty("zero1Hz").GetDouble(), 1e-6);
        Assert.Equal(25e3, c.GetProperty("pole1Hz").GetDouble(), 1e-3);
    }

    [Fact]
    public async Task Resonance_on_a_peak_current_mode_buck_puts_the_zero_at_the_load_pole()
    {
        // Peak current mode: Type II, zero at the load pole (the lowest real pole of the plant), pole at the ESR zero or
        // fs/2 (common practice, no source). Ridley 1991: wp = 1 / (R C) + Ts (mc D' - 0.5) / (L C), with the example's
        // ramp Se = 0.5 Sf, so mc = 1 + 0.5 Vout / (Vin - Vout); lossless D = Vout / Vin at the nominal 12 V. The losses
        // (DCR, switch resistances) move it by about 1.5 % here, hence 3 %.
        string example = RepoFiles.Example("pol-12v-to-3v3-peak-current-mode.json");
        using var doc = await SynthesizeCommandTests.Json("suggest", example, "--method", "resonance");
        var r = doc.RootElement;
        Assert.Equal("currentModeResonance", r.GetProperty("method").GetString());
        Assert.Equal("typeII", r.GetProperty("compensator").GetProperty("type").GetString());
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        var stage = ((BuckPlant)design.Plant).PowerStage;
        double c = stage.OutputCapacitors.Sum(b => b.TotalCapacitanceF), l = stage.Inductor.InductanceH, rLoad = stage.OutputVoltageV / stage.LoadCurrent.MaxA;
        double vin = stage.InputVoltage.NominalV, vout = stage.OutputVoltageV, d = vout / vin;
        double mc = 1 + (0.5 * vout / (vin - vout));
        double fp = ((1 / (rLoad * c)) + ((mc * (1 - d)) - 0.5) / (stage.SwitchingFrequencyHz * l * c)) / (2 * Math.PI);
        Assert.Equal(885.6, fp, 0.1); // by hand: (5050.5 + 514.2 rad/s) / 2 pi
        Assert.InRange(r.GetProperty("compensator").GetProperty("zero1Hz").GetDouble(), fp * 0.97, fp * 1.03);
    }

    [Fact]
    public async Task A_plant_without_what_the_method_needs_is_exit_code_2()
    {
        // The LED driver's only poles are a complex pair: no real load pole for the current-mode placement.
        string example = RepoFiles.Example("custom-boost-led-driver-rhp-zero.json");
        var run = await CliRun.Of("suggest", example, "--method", "resonance", "--type", "typeII");
        Assert.Equal(2, run.ExitCode);
        Assert.Equal($"{example}: error: --method: The plant has no real pole to take as the load pole: the current-mode resonance placement needs one; use the K factor.", run.Error.TrimEnd('\n'));
    }

    [Fact]
    public async Task An_unreachable_target_is_warned_not_refused()
    {
        // 150 kHz is above a fifth of 400 kHz (common practice, no source).
        using var doc = await SynthesizeCommandTests.Json("suggest", Industrial, "--crossover", "150k");
        Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("above a fifth of the switching frequency", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("--crossover", "0", "error: --crossover: 0 Hz is out of range: allowed 1.00 mHz to 1.00 GHz.")]
    [InlineData("--crossover", "50 kV", "error: --crossover: '50 kV' has an unknown prefix or a unit other than Hz; allowed prefixes p n u m k M G.")]
    [InlineData("--phase-margin", "200", "error: --phase-margin: 200 deg is out of range: allowed 1.00 deg to 179 deg.")]
    public async Task Bad_targets_are_exit_code_2_with_the_option_named(string option, string value, string message)
    {
        var run = await CliRun.Of("suggest", Industrial, option, value);
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.Equal(message, run.Error.TrimEnd('\n'));
    }

    [Fact]
    public async Task Unknown_words_are_parse_errors_with_exit_code_2()
    {
        var run = await CliRun.Of("suggest", Industrial, "--method", "guess");
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("guess", run.Error, StringComparison.Ordinal);
        Assert.Equal(2, (await CliRun.Of("suggest", Industrial, "--type", "typeIV")).ExitCode);
    }
}
