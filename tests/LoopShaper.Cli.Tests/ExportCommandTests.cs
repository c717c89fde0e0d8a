using System.Numerics;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Synthesis.Tests;

namespace LoopShaper.Cli.Tests;

/// <summary>
/// `export` in-process on the committed examples: the parts CSV parsed back, and the netlists run live by ngspice
/// (Debian package ngspice; the test fails when it is missing) against the core's responses.
/// </summary>
public class ExportCommandTests
{
    // Tolerances of issue 5: 0.01 dB and 0.05 deg; the netlist's 1e9 V/V amplifier accounts for less than 1e-4 dB.
    private const double MagnitudeToleranceDb = 0.01;
    private const double PhaseToleranceDeg = 0.05;

    [Theory]
    [MemberData(nameof(Placements))]
    public async Task Parts_csv_of_a_placement_parses_back_to_the_values_synthesize_prints(string example)
    {
        using var printed = await SynthesizeCommandTests.Json("synthesize", RepoFiles.Example(example));
        var expected = SynthesizeCommandTests.Parts(printed);
        var run = await CliRun.Of("export", RepoFiles.Example(example), "--parts");
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        Assert.StartsWith(PartsListCsv.Header + "\n", run.Output, StringComparison.Ordinal);
        var entries = PartsListCsv.Parse(run.Output);
        Assert.Equal(expected.Keys, entries.Select(e => e.Designator));
        foreach (var e in entries)
        {
            var p = expected[e.Designator];
            Assert.Equal(p.Chosen, e.Value);
            Assert.Equal(p.Series, e.Series.ToString());
            Assert.Equal(p.TolerancePct, e.TolerancePct);
            Assert.Equal(e.Designator.StartsWith('R') ? PartKind.Resistor : PartKind.Capacitor, e.Kind);
            Assert.False(string.IsNullOrEmpty(e.Role));
        }
    }

    [Fact]
    public async Task Parts_csv_of_a_network_lists_its_own_values_with_the_section_tolerances()
    {
        string example = RepoFiles.Example("core-rail-12v-to-1v0.json");
        var n = (OpAmpNetwork)DesignFile.Read(File.ReadAllText(example)).Design!.Compensator;
        var run = await CliRun.Of("export", example, "--parts");
        Assert.Equal(0, run.ExitCode);
        var e = PartsListCsv.Parse(run.Output).ToDictionary(x => x.Designator);
        Assert.Equal(["R1", "R2", "C1", "C2", "R3", "C3", "R4"], e.Keys);
        Assert.Equal(n.R1Ohm, e["R1"].Value);
        Assert.Equal(n.R2Ohm, e["R2"].Value);
        Assert.Equal(n.R3Ohm, e["R3"].Value);
        Assert.Equal(n.RBottomOhm, e["R4"].Value);
        Assert.Equal(n.C1F, e["C1"].Value);
        Assert.Equal(n.C2F, e["C2"].Value);
        Assert.Equal(n.C3F, e["C3"].Value);
        // The example's synthesis section: E24 resistors at 1 %, E12 capacitors at 5 %, C1 and C3 at 10 %.
        Assert.All(e.Values.Where(x => x.Kind == PartKind.Resistor), x => Assert.Equal((ESeries.E24, 1.0), (x.Series!.Value, x.TolerancePct)));
        Assert.Equal((ESeries.E12, 10.0), (e["C1"].Series!.Value, e["C1"].TolerancePct));
        Assert.Equal((ESeries.E12, 5.0), (e["C2"].Series!.Value, e["C2"].TolerancePct));
        Assert.Equal((ESeries.E12, 10.0), (e["C3"].Series!.Value, e["C3"].TolerancePct));

        // 5.6 kOhm is in E24 and not in E96 (IEC 60063): asked for E96, the list names the series that holds it.
        var e96 = PartsListCsv.Parse((await CliRun.Of("export", example, "--parts", "--series", "E96")).Output).ToDictionary(x => x.Designator);
        Assert.Equal(ESeries.E24, e96["R2"].Series);
        Assert.Equal(ESeries.E96, e96["R1"].Series);
    }

    [Theory]
    [MemberData(nameof(OpAmpExamples))]
    public async Task Compensator_netlist_runs_in_ngspice_with_the_core_response(string example)
    {
        var run = await CliRun.Of("export", RepoFiles.Example(example), "--netlist");
        Assert.Equal(0, run.ExitCode);
        Assert.StartsWith("* LoopShaper compensator netlist", run.Output, StringComparison.Ordinal);
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example))).Design!;
        Assert.Contains($"* design: {design.Name}", run.Output, StringComparison.Ordinal);

        var network = await ExportedNetwork(example, design);
        // The netlist models the design's own amplifier (ideal E source, or the op-amp macro-model with A0, GBW and
        // any second pole), so the reference is the core's Gc with that amplifier, and nothing is warned.
        Assert.Equal(string.Empty, run.Error);
        Assert.Equal(network.HasIdealAmplifier, !run.Output.Contains("op-amp macro-model", StringComparison.Ordinal));
        var points = Ngspice.RunAc(run.Output, "v(gc)");
        Assert.Equal(241, points.Count);
        Compare(network.TransferFunction(), points, example);
    }

    [Theory]
    [MemberData(nameof(VoltageModeCcm))]
    public async Task Averaged_loop_netlist_runs_in_ngspice_with_the_core_loop_gain(string example)
    {
        var run = await CliRun.Of("export", RepoFiles.Example(example), "--netlist", "--loop");
        Assert.Equal(0, run.ExitCode);
        Assert.StartsWith("* LoopShaper averaged small-signal loop", run.Output, StringComparison.Ordinal);
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example))).Design!;
        var built = DesignSynthesizer.WithParts(design, await ExportedNetwork(example, design));
        var points = Ngspice.RunAc(run.Output, "v(t)");
        // The loop gain of the design built with the exported parts (Erickson & Maksimovic 2nd ed., sec. 8.2 and 7.2).
        Compare(DesignAnalyzer.BuildLoop(built).Loop.LoopGain, points, example);
    }

    [Fact]
    public async Task Series_options_reach_the_exported_parts()
    {
        string example = RepoFiles.Example("usb-5v-to-3v3-diode.json");
        var e24 = PartsListCsv.Parse((await CliRun.Of("export", example, "--parts", "--series", "E24", "--no-search")).Output);
        var e96 = PartsListCsv.Parse((await CliRun.Of("export", example, "--parts", "--no-search")).Output);
        Assert.All(e24.Where(p => p.Kind == PartKind.Resistor), p => Assert.True(StandardValues.IsPreferred(p.Value, ESeries.E24) && p.Series == ESeries.E24, p.ToString()));
        Assert.All(e96.Where(p => p.Kind == PartKind.Resistor), p => Assert.Equal(ESeries.E96, p.Series));
        Assert.NotEqual(e24.Where(p => p.Kind == PartKind.Resistor).Select(p => p.Value), e96.Where(p => p.Kind == PartKind.Resistor).Select(p => p.Value));
    }

    [Fact]
    public async Task Output_goes_to_the_out_file()
    {
        using var file = new TempFile("comp.cir");
        var run = await CliRun.Of("export", RepoFiles.Example("core-rail-12v-to-1v0.json"), "--netlist", "--out", file.Path);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.EndsWith(".end\n", File.ReadAllText(file.Path), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(new[] { "core-rail-12v-to-1v0.json" }, "error: export needs exactly one of --netlist and --parts.")]
    [InlineData(new[] { "core-rail-12v-to-1v0.json", "--netlist", "--parts" }, "error: export needs exactly one of --netlist and --parts.")]
    [InlineData(new[] { "core-rail-12v-to-1v0.json", "--parts", "--loop" }, "error: --loop: goes with --netlist (the loop's netlist), not with --parts.")]
    [InlineData(new[] { "core-rail-12v-to-1v0.json", "--parts", "--cap-series", "E48" }, "error: --cap-series: E48 is not offered for capacitors: allowed E6, E12, E24.")]
    public async Task Bad_requests_are_exit_code_2(string[] args, string message)
    {
        var run = await CliRun.Of(["export", RepoFiles.Example(args[0]), .. args[1..]]);
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.Equal(message, run.Error.TrimEnd('\n'));
    }

    [Theory]
    [InlineData("custom-boost-led-driver-rhp-zero.json", "custom")]
    [InlineData("pol-12v-to-3v3-peak-current-mode.json", "peak current-mode CCM")]
    [InlineData("sensor-24v-to-5v-light-load-dcm.json", "voltage-mode DCM")]
    public async Task Loop_netlist_without_a_power_stage_circuit_is_the_analysed_plant_in_state_space(string name, string model)
    {
        string example = RepoFiles.Example(name);
        var run = await CliRun.Of("export", example, "--netlist", "--loop");
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        Assert.StartsWith($"* LoopShaper loop netlist: state-space realisation of the {model} plant", run.Output, StringComparison.Ordinal);

        // The core's loop gain of the design with the exported parts (DesignAnalyzer.BuildLoop), against ngspice at
        // every point of the 241-point sweep; the phase modulo 360 deg (the custom plant's 1.5 us delay turns more
        // than 180 deg between points near 10 MHz, too fast to unwrap the principal value).
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        LoopDesign built = design.Compensator switch
        {
            TransconductanceNetwork => DesignSynthesizer.TrySynthesizeOta(design, DesignSynthesizer.OptionsOf(design), out var ota, out _) ? ota!.BuiltDesign : throw new InvalidOperationException(),
            _ => DesignSynthesizer.WithParts(design, await ExportedNetwork(name, design)),
        };
        var t = DesignAnalyzer.BuildLoop(built).Loop.LoopGain;
        var points = Ngspice.RunAc(run.Output, "v(t)");
        Assert.Equal(241, points.Count);
        foreach (var (f, v) in points)
        {
            double dDeg = t.PhaseDeg(f) - (v.Phase * 180 / Math.PI);
            dDeg -= 360 * Math.Round(dDeg / 360);
            Assert.True(Math.Abs(t.MagnitudeDb(f) - (20 * Math.Log10(v.Magnitude))) <= MagnitudeToleranceDb, $"{name} at {f:G6} Hz: ours {t.MagnitudeDb(f):F5} dB, ngspice {20 * Math.Log10(v.Magnitude):F5} dB");
            Assert.True(Math.Abs(dDeg) <= PhaseToleranceDeg, $"{name} at {f:G6} Hz: {dDeg:F4} deg apart");
        }
    }

    [Fact]
    public async Task Forcing_the_ccm_model_at_a_dcm_point_gives_the_matching_netlist()
    {
        // analysis.conductionModel = "ccm" analyses the CCM model at the DCM point; the CCM netlist is then that loop.
        var j = System.Text.Json.Nodes.JsonNode.Parse(File.ReadAllText(RepoFiles.Example("sensor-24v-to-5v-light-load-dcm.json")))!;
        j["analysis"]!["conductionModel"] = "ccm";
        // An ideal amplifier, as in the netlist.
        j["compensator"]!.AsObject().Remove("amplifier");
        using var file = new TempFile("ccm.json", j.ToJsonString());
        var run = await CliRun.Of("export", file.Path, "--netlist", "--loop");
        Assert.Equal(0, run.ExitCode);
        var design = DesignFile.Read(File.ReadAllText(file.Path)).Design!;
        Compare(DesignAnalyzer.BuildLoop(design).Loop.LoopGain, Ngspice.RunAc(run.Output, "v(t)"), "sensor, CCM model");
    }

    [Fact]
    public async Task An_ota_compensator_exports_its_parts_and_netlist()
    {
        // The peak current-mode example has an OTA Type II compensator (gm = 1 mS, Ro = 5 MOhm, R2 22k, C1 3.3 nF, C2 47 pF).
        string example = RepoFiles.Example("pol-12v-to-3v3-peak-current-mode.json");
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        Assert.True(DesignSynthesizer.TrySynthesizeOta(design, DesignSynthesizer.OptionsOf(design), out var expected, out _));

        var parts = await CliRun.Of("export", example, "--parts");
        Assert.Equal(0, parts.ExitCode);
        var e = PartsListCsv.Parse(parts.Output).ToDictionary(x => x.Designator);
        Assert.Equal(["C1", "C2", "R2"], e.Keys.Order(StringComparer.Ordinal));
        // The parts to build: the neighbour search's (on by default), which keeps the snapped values here at +-2 steps.
        foreach (var p in expected!.Synthesis.ChosenParts)
        {
            Assert.Equal(p.Value.Value, e[p.Designator].Value, 1e-12 * p.Value.Value);
            Assert.Equal(p.Kind, e[p.Designator].Kind);
            Assert.Equal(p.Role, e[p.Designator].Role);
        }

        // The synthesis starts from the placement the example's own values give, so the parts land on them again
        // where the series holds them (IEC 60063): 3.3 nF and 47 pF are E12; 22 kOhm is E24 but not E96 (the default
        // series here), whose nearest value is 22.1 kOhm.
        Assert.Equal(22.1e3, e["R2"].Value, 1e-6);
        var e24 = PartsListCsv.Parse((await CliRun.Of("export", example, "--parts", "--series", "E24")).Output).ToDictionary(x => x.Designator);
        Assert.Equal(22e3, e24["R2"].Value, 1e-6);
        Assert.Equal(ESeries.E24, e24["R2"].Series);
        Assert.Equal(3.3e-9, e["C1"].Value, 1e-18);
        Assert.Equal(47e-12, e["C2"].Value, 1e-20);

        var netlist = await CliRun.Of("export", example, "--netlist");
        Assert.Equal(0, netlist.ExitCode);
        Assert.Contains("transconductance (OTA) network", netlist.Output, StringComparison.Ordinal);
        var built = (TransconductanceNetwork)expected.BuiltDesign.Compensator;
        Compare(built.TransferFunction(), Ngspice.RunAc(netlist.Output, "v(gc)"), "OTA example");

        // The loop netlist carries the same OTA network around the state-space peak current-mode plant.
        var loop = await CliRun.Of("export", example, "--netlist", "--loop");
        Assert.Equal(0, loop.ExitCode);
        Assert.Contains(loop.Output.Split('\n'), l => l == $"R2 comp n2 {built.R2Ohm.ToString("R", System.Globalization.CultureInfo.InvariantCulture)}");
    }

    [Fact]
    public async Task An_ota_export_honours_the_search_options()
    {
        // --search-steps and --no-search steer the OTA export as they steer the op-amp one: the parts list and the
        // netlist carry the chosen values of the core's synthesis with the same options.
        string example = RepoFiles.Example("pol-12v-to-3v3-peak-current-mode.json");
        var design = DesignFile.Read(File.ReadAllText(example)).Design!;
        var o = DesignSynthesizer.OptionsOf(design);
        Assert.True(DesignSynthesizer.TrySynthesizeOta(design, o with { SearchSteps = 3 }, out var wide, out _));
        Assert.True(DesignSynthesizer.TrySynthesizeOta(design, o with { SearchNeighbours = false }, out var plain, out _));
        Assert.NotNull(wide!.Synthesis.Search);
        Assert.Null(plain!.Synthesis.Search);

        foreach (var (args, expected) in new[] { (new[] { "--search-steps", "3" }, wide), (["--no-search"], plain) })
        {
            var run = await CliRun.Of(["export", example, "--parts", .. args]);
            Assert.Equal(0, run.ExitCode);
            var e = PartsListCsv.Parse(run.Output).ToDictionary(x => x.Designator);
            Assert.All(expected.Synthesis.ChosenParts, p => Assert.Equal(p.Value.Value, e[p.Designator].Value, 1e-12 * p.Value.Value));

            var netlist = await CliRun.Of(["export", example, "--netlist", .. args]);
            Assert.Equal(0, netlist.ExitCode);
            Compare(expected.Synthesis.ChosenNetwork.TransferFunction(), Ngspice.RunAc(netlist.Output, "v(gc)"), $"OTA example {string.Join(' ', args)}");
        }

        // Wider steps move a part on this example (the search finds a closer loop), so the two exports differ.
        Assert.NotEqual(wide.Synthesis.ChosenNetwork, plain.Synthesis.ChosenNetwork);
    }

    public static TheoryData<string> OpAmpExamples() => SynthesizeCommandTests.OpAmpExamples();

    public static TheoryData<string> Placements()
    {
        var data = new TheoryData<string>();
        foreach (string e in Directory.GetFiles(RepoFiles.ExamplesDir, "*.json").Select(f => Path.GetFileName(f)).Order(StringComparer.Ordinal))
        {
            if (DesignFile.Read(File.ReadAllText(RepoFiles.Example(e))).Design!.Compensator is CompensatorPlacement)
            {
                data.Add(e);
            }
        }

        return data;
    }

    /// <summary>The examples of a voltage-mode buck analysed in CCM: the averaged netlist is their loop.</summary>
    public static TheoryData<string> VoltageModeCcm() => ["battery-72v-to-12v-high-voltage.json", "core-rail-12v-to-1v0.json", "industrial-24v-to-5v.json", "usb-5v-to-3v3-diode.json"];

    /// <summary>The network the export writes: the design's own, or the parts `synthesize` chooses.</summary>
    private static async Task<OpAmpNetwork> ExportedNetwork(string example, LoopDesign design)
    {
        if (design.Compensator is OpAmpNetwork n)
        {
            return n;
        }

        using var doc = await SynthesizeCommandTests.Json("synthesize", RepoFiles.Example(example));
        return SynthesizeCommandTests.NetworkOf(doc.RootElement, Enum.Parse<CompensatorType>(doc.RootElement.GetProperty("compensatorType").GetString()!, ignoreCase: true));
    }

    private static void Compare(TransferFunction h, List<(double FrequencyHz, Complex Value)> points, string name)
    {
        // ngspice's phase is a principal value, unwrapped point by point from 10 Hz; ours is continuous by construction.
        double? previous = null;
        foreach (var (f, v) in points)
        {
            double refDb = 20 * Math.Log10(v.Magnitude);
            double refDeg = v.Phase * 180 / Math.PI;
            if (previous is double p)
            {
                refDeg -= 360 * Math.Round((refDeg - p) / 360);
            }
            else
            {
                refDeg -= 360 * Math.Round((refDeg - h.PhaseDeg(f)) / 360);
            }

            previous = refDeg;
            Assert.True(Math.Abs(h.MagnitudeDb(f) - refDb) <= MagnitudeToleranceDb, $"{name} at {f:G6} Hz: ours {h.MagnitudeDb(f):F5} dB, ngspice {refDb:F5} dB");
            Assert.True(Math.Abs(h.PhaseDeg(f) - refDeg) <= PhaseToleranceDeg, $"{name} at {f:G6} Hz: ours {h.PhaseDeg(f):F4} deg, ngspice {refDeg:F4} deg");
        }
    }
}
