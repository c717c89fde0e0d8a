using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli.Tests;

public class DesignFileRoundTripTests
{
    [Theory]
    [MemberData(nameof(Examples))]
    public void Every_example_reads_analyses_without_input_errors_and_round_trips(string example)
    {
        var read = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example)));
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
        var design = read.Design!;

        var analysis = DesignAnalyzer.Analyze(design);
        Assert.True(analysis.IsValid, string.Join("\n", analysis.Issues));
        Assert.DoesNotContain(analysis.Issues, i => i.Severity == Severity.Error);

        string written = DesignFile.Write(design);
        var again = DesignFile.Read(written);
        Assert.True(again.Errors.IsEmpty, string.Join("\n", again.Errors));
        Structural.AssertEqual(design, again.Design);
        Assert.Equal(written, DesignFile.Write(again.Design!));
    }

    [Fact]
    public void At_least_three_examples_meet_their_criteria_and_the_warnings_they_exist_for_show()
    {
        var analyses = Directory.GetFiles(RepoFiles.ExamplesDir, "*.json")
            .ToDictionary(f => Path.GetFileName(f), f => DesignAnalyzer.Analyze(DesignFile.Read(File.ReadAllText(f)).Design!));
        Assert.True(analyses.Count >= 5);
        Assert.True(analyses.Values.Count(a => a.MeetsCriteria) >= 3);

        // The diode-rectified rail runs in DCM at its 50 mA standby load; the 72 V bus is above the ES1 limit.
        Assert.Contains(analyses["usb-5v-to-3v3-diode.json"].Warnings, w => w.StartsWith("DCM:", StringComparison.Ordinal));
        Assert.Contains(analyses["battery-72v-to-12v-high-voltage.json"].Warnings, w => w.StartsWith("HAZARDOUS VOLTAGE", StringComparison.Ordinal));
        var custom = Assert.IsType<CustomPlant>(analyses["custom-boost-led-driver-rhp-zero.json"].Design.Plant);
        Assert.Contains(custom.Zeros, z => z.RightHalfPlane);
        Assert.True(custom.DelayS > 0);
        var core = analyses["core-rail-12v-to-1v0.json"].Design;
        Assert.IsType<OpAmpNetwork>(core.Compensator);
        Assert.Equal(CompensatorType.TypeIII, core.Compensator.Type);
    }

    [Fact]
    public void The_example_in_the_format_documentation_reads_and_analyses()
    {
        string doc = File.ReadAllText(Path.Combine(RepoFiles.Root, "docs", "design-file.md"));
        int start = doc.IndexOf("```json\n{", StringComparison.Ordinal) + "```json\n".Length;
        int end = doc.IndexOf("```", start, StringComparison.Ordinal);
        var read = DesignFile.Read(doc[start..end]);
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
        var analysis = DesignAnalyzer.Analyze(read.Design!);
        Assert.True(analysis.IsValid, string.Join("\n", analysis.Issues));
    }

    [Fact]
    public void Awkward_numbers_and_every_optional_shape_round_trip_bit_exactly()
    {
        // Values that a fixed-digit writer would change: 0.1 + 0.2, 1/3, a subnormal, the largest double.
        var plant = new CustomPlant(
            CustomPlantForm.Coefficients,
            [0.1 + 0.2, 1.0 / 3.0, double.Epsilon],
            [1.0, 2e-7, double.MaxValue, -0.0],
            Gain: 2.5,
            OriginOrder: -1,
            Zeros: [new Factor(1234.5678901234567, 0.7, RightHalfPlane: true)],
            Poles: [Factor.Real(9.87654321e5)],
            DelayS: 1.0 / 7.0 * 1e-6,
            DividerRatio: 0.123456789012345678,
            SwitchingFrequencyHz: null);
        var compensator = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.MidbandGainDb, -3.3), Zero1Hz: 1e3 / 3, Zero2Hz: 7.0, Pole1Hz: 5e4, Pole2Hz: null);
        var design = new LoopDesign("µ-test \"quoted\" Ω", "line 1\nline 2 — ü", plant, compensator,
            new AnalysisSettings(StartHz: 0.3, StopHz: 3e6 / 7, Points: 777, Input: InputCorner.Min, Load: LoadCorner.Min, StepDurationS: 1e-3 / 3),
            new DesignCriteria(MaxOvershootPct: 12.5, MaxLoadStepDeviationV: 0.1 + 0.7));

        var back = DesignFile.Read(DesignFile.Write(design));
        Assert.True(back.Errors.IsEmpty, string.Join("\n", back.Errors));
        Structural.AssertEqual(design, back.Design);
    }

    [Fact]
    public void An_op_amp_network_and_a_buck_with_feedforward_round_trip()
    {
        var text = File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json"));
        var design = DesignFile.Read(text).Design!;
        var buck = (BuckPlant)design.Plant;
        var changed = design with
        {
            Plant = buck with { Control = (VoltageModeControl)buck.Control with { RampAmplitudeV = 0.7, ModulatorDelayS = 3.3e-8 } },
            Compensator = new OpAmpNetwork(CompensatorType.TypeII, R1Ohm: 52.3e3, C1F: 4.7e-9, R2Ohm: 22e3, C2F: 100e-12, RBottomOhm: 10e3),
        };
        var back = DesignFile.Read(DesignFile.Write(changed));
        Assert.True(back.Errors.IsEmpty, string.Join("\n", back.Errors));
        Structural.AssertEqual(changed, back.Design);
    }

    [Fact]
    public void Writing_a_non_finite_number_names_its_path()
    {
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example("core-rail-12v-to-1v0.json"))).Design!;
        var buck = (BuckPlant)design.Plant;
        var broken = design with { Plant = buck with { PowerStage = buck.PowerStage with { Inductor = new Inductor(double.NaN, 1e-3) } } };
        var ex = Assert.Throws<ArgumentException>(() => DesignFile.Write(broken));
        Assert.Contains("$.plant.powerStage.inductor.inductanceH", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Written_files_use_base_units_and_the_documented_header()
    {
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example("core-rail-12v-to-1v0.json"))).Design!;
        string written = DesignFile.Write(design);
        Assert.StartsWith("{\n  \"format\": \"loopshaper-design\",\n  \"version\": 2,\n", written, StringComparison.Ordinal);
        // "330 nH" in the example is written as a number in henries.
        using var doc = System.Text.Json.JsonDocument.Parse(written);
        var l = doc.RootElement.GetProperty("plant").GetProperty("powerStage").GetProperty("inductor").GetProperty("inductanceH");
        Assert.Equal(System.Text.Json.JsonValueKind.Number, l.ValueKind);
        Assert.Equal(330e-9, l.GetDouble(), 1e-21);
        Assert.EndsWith("}\n", written, StringComparison.Ordinal);
    }

    public static TheoryData<string> Examples() => RepoFiles.Examples();
}
