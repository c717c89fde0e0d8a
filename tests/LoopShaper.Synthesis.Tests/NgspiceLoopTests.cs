using System.Numerics;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Synthesis;
using Xunit.Abstractions;

namespace LoopShaper.Synthesis.Tests;

/// <summary>
/// The loop netlist of the models without a power-stage circuit (peak current mode, DCM, custom plant): the analysed
/// plant realised as state-space sections, run unmodified by ngspice (Debian package ngspice, live), against the core's
/// loop gain T(s) from DesignAnalyzer.BuildLoop, on the committed examples in docs/examples.
/// </summary>
public class NgspiceLoopTests(ITestOutputHelper output)
{
    // Same tolerances as the compensator netlists (issue 5: 0.01 dB, 0.05 deg): the netlist is the same rational
    // function and delay; only the 1e12 Ohm state leaks (poles moved by 1e-12 rad/s) and the 1e9 V/V ideal amplifier
    // separate the two.
    private const double MagnitudeToleranceDb = 0.01;
    private const double PhaseToleranceDeg = 0.05;

    public static TheoryData<string, SmallSignalModel> Examples => new()
    {
        { "pol-12v-to-3v3-peak-current-mode.json", SmallSignalModel.PeakCurrentModeContinuous },
        { "sensor-24v-to-5v-light-load-dcm.json", SmallSignalModel.VoltageModeDiscontinuous },
        { "custom-boost-led-driver-rhp-zero.json", SmallSignalModel.Custom },
    };

    [Theory]
    [MemberData(nameof(Examples))]
    public void State_space_loop_netlist_gives_the_core_loop_gain_at_20_frequencies(string file, SmallSignalModel model)
    {
        var (design, network) = Load(file);
        var built = DesignAnalyzer.BuildLoop(design);
        Assert.Equal(model, built.Model);
        Assert.False(AveragedLoopSupport.UsesAveragedCircuit(design));

        // 20 frequencies: 4 per decade over the five decades from 10 Hz to 1 MHz (21 points with both ends).
        string netlist = SpiceNetlist.Loop(design, network, new SpiceSweep(4, 10, 1e6));
        Assert.StartsWith("* LoopShaper loop netlist: state-space realisation", netlist, StringComparison.Ordinal);
        Assert.Contains($"* design: {design.Name}", netlist, StringComparison.Ordinal);
        var points = Ngspice.RunAc(netlist, "v(t)");
        Assert.Equal(21, points.Count);
        var t = built.Loop.LoopGain;
        var (db, deg) = MaxDifference(t, points);
        output.WriteLine($"{file}: max |dB| {db:E2}, max |deg| {deg:E2} over {points.Count} frequencies");
        Assert.True(db <= MagnitudeToleranceDb, $"{file}: {db} dB");
        Assert.True(deg <= PhaseToleranceDeg, $"{file}: {deg} deg");
    }

    [Fact]
    public void Peak_current_mode_in_DCM_is_realised_too()
    {
        // The peak current-mode example with a diode rectifier (0.4 V, our own numbers) analysed at a 50 mA minimum load:
        // below the CCM/DCM boundary, so the analysis uses the DCM model with the peak-current duty-cycle law.
        var (design, network) = Load("pol-12v-to-3v3-peak-current-mode.json");
        var buck = (BuckPlant)design.Plant;
        var stage = buck.PowerStage with { Rectifier = Rectifier.Diode(0.4, 0.0), LoadCurrent = new CurrentRange(0.05, buck.PowerStage.LoadCurrent.MaxA) };
        design = design with { Plant = buck with { PowerStage = stage }, Analysis = design.Analysis with { Load = LoadCorner.Min } };
        var built = DesignAnalyzer.BuildLoop(design);
        Assert.Equal(SmallSignalModel.PeakCurrentModeDiscontinuous, built.Model);
        string netlist = SpiceNetlist.Loop(design, network, new SpiceSweep(4, 10, 1e6));
        Assert.StartsWith("* LoopShaper loop netlist: state-space realisation of the peak current-mode DCM plant", netlist, StringComparison.Ordinal);
        var (db, deg) = MaxDifference(built.Loop.LoopGain, Ngspice.RunAc(netlist, "v(t)"));
        output.WriteLine($"PCM in DCM: max |dB| {db:E2}, max |deg| {deg:E2}");
        Assert.True(db <= MagnitudeToleranceDb, $"{db} dB");
        Assert.True(deg <= PhaseToleranceDeg, $"{deg} deg");
    }

    [Fact]
    public void Voltage_mode_CCM_with_an_ota_is_the_averaged_circuit_with_the_divider()
    {
        // The test buck (TestPlants, 10 k / 10 k divider) with an OTA Type II network of our own (gm 1 mS, Ro 5 MOhm):
        // the averaged CCM circuit (Erickson & Maksimovic 2nd ed., sec. 7.2), the divider Rtop, Rbot ahead of the OTA.
        // The divider's 20 kOhm loads the output in the circuit and not in the core: 1e-5 relative against the 0.2 Ohm load.
        var ota = new TransconductanceNetwork(CompensatorType.TypeII, new Transconductance(1e-3, 5e6), C1F: 2.2e-9, R2Ohm: 4.7e3, C2F: 68e-12);
        var design = TestPlants.Buck(ota);
        string netlist = SpiceNetlist.Loop(design);
        Assert.StartsWith("* LoopShaper averaged small-signal loop: voltage-mode CCM buck with a Type II OTA compensator", netlist, StringComparison.Ordinal);
        Assert.Contains("Rtop out fb 10000", netlist, StringComparison.Ordinal);
        var (db, deg) = MaxDifference(DesignAnalyzer.BuildLoop(design).Loop.LoopGain, Ngspice.RunAc(netlist, "v(t)"));
        output.WriteLine($"VM CCM with an OTA: max |dB| {db:E2}, max |deg| {deg:E2}");
        Assert.True(db <= MagnitudeToleranceDb, $"{db} dB");
        Assert.True(deg <= PhaseToleranceDeg, $"{deg} deg");
    }

    [Fact]
    public void Voltage_mode_CCM_keeps_the_averaged_circuit_and_a_delay_becomes_a_line()
    {
        var n = NgspiceExportTests.Network(CompensatorType.TypeIII);
        var vm = TestPlants.Buck(n);
        Assert.True(AveragedLoopSupport.UsesAveragedCircuit(vm));
        Assert.StartsWith("* LoopShaper averaged small-signal loop", SpiceNetlist.Loop(vm), StringComparison.Ordinal);

        var (custom, network) = Load("custom-boost-led-driver-rhp-zero.json");
        string netlist = SpiceNetlist.Loop(custom, network);
        // The example's delayS is 1.5 us.
        Assert.Contains(": a matched lossless line, exact in AC analysis", netlist, StringComparison.Ordinal);
        Assert.Contains(netlist.Split('\n'), l => l.StartsWith("Txd xd2 0 xd 0 Z0=50 TD=", StringComparison.Ordinal) && double.Parse(l.Split("TD=")[1], System.Globalization.CultureInfo.InvariantCulture) == 1.5e-6);
        var placement = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 1e3), Zero1Hz: 1e3, Pole1Hz: 1e5);
        var ex = Assert.Throws<ArgumentException>(() => SpiceNetlist.StateSpaceLoop(custom with { Compensator = placement }));
        Assert.Contains("synthesise the parts first", ex.Message, StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(Examples))]
    public void State_space_netlists_are_plain_SPICE3_with_unique_element_names(string file, SmallSignalModel model)
    {
        var (design, network) = Load(file);
        string netlist = SpiceNetlist.Loop(design, network);
        var lines = netlist.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(".end", lines[^1]);
        Assert.Contains(lines, l => l.StartsWith("* model: ", StringComparison.Ordinal));
        Assert.DoesNotContain(".control", netlist, StringComparison.Ordinal);
        Assert.DoesNotContain("POLY", netlist, StringComparison.OrdinalIgnoreCase);
        var elements = lines.Where(l => !l.StartsWith('*') && !l.StartsWith('.')).ToList();
        // Only SPICE3 element letters: R, C, L, V, E, G, T; SPICE names are case-insensitive and must be unique.
        Assert.All(elements, l => Assert.Contains(char.ToUpperInvariant(l[0]), "RCLVEGT"));
        var names = elements.Select(l => l.Split(' ')[0].ToUpperInvariant()).ToList();
        Assert.Equal(names.Count, names.Distinct(StringComparer.Ordinal).Count());
        Assert.Equal(model, DesignAnalyzer.BuildLoop(design).Model);
        Assert.Equal(DesignAnalyzer.BuildLoop(design).Loop.Plant.HasDelay, netlist.Contains("Txd ", StringComparison.Ordinal));
    }

    /// <summary>A committed example with its compensator as parts: as given, or synthesised from its placement.</summary>
    internal static (LoopDesign Design, Compensator Network) Load(string file)
    {
        var read = DesignFile.Read(File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", file)));
        var design = read.Design ?? throw new InvalidOperationException(string.Join("; ", read.Errors.Select(e => e.Message)));
        if (design.Compensator is OpAmpNetwork or TransconductanceNetwork)
        {
            return (design, design.Compensator);
        }

        Assert.True(DesignSynthesizer.TrySynthesize(design, DesignSynthesizer.OptionsOf(design), out var r, out var issues), string.Join("; ", issues.Select(i => i.Message)));
        return (r!.BuiltDesign, r.BuiltDesign.Compensator);
    }

    private static (double Db, double Deg) MaxDifference(Core.TransferFunctions.TransferFunction h, List<(double FrequencyHz, Complex Value)> points)
    {
        // ngspice's phase is the principal value; 20 points over five decades are too sparse to unwrap it (the custom
        // plant's 1.5 us delay alone turns 236 deg between the last two points), so the difference is taken modulo 360 deg.
        double db = 0, deg = 0;
        foreach (var (f, v) in points)
        {
            double d = h.PhaseDeg(f) - (v.Phase * 180 / Math.PI);
            d -= 360 * Math.Round(d / 360);
            db = Math.Max(db, Math.Abs(h.MagnitudeDb(f) - (20 * Math.Log10(v.Magnitude))));
            deg = Math.Max(deg, Math.Abs(d));
        }

        return (db, deg);
    }

    private static string RepoRoot()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
        {
            if (File.Exists(Path.Combine(d.FullName, "LoopShaper.sln")))
            {
                return d.FullName;
            }
        }

        throw new InvalidOperationException("LoopShaper.sln not found above the test's directory.");
    }
}
