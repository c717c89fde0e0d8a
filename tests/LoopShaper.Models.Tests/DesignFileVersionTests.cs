using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Reporting;

namespace LoopShaper.Models.Tests;

/// <summary>The design file's version 2 fields (docs/design-file.md): written and read back exactly, refused in a version 1 file.</summary>
public class DesignFileVersionTests
{
    private static readonly string ExamplesDir = FindExamples();

    public static TheoryData<string> Designs() => ["pcm with ramp as mc and delay fraction", "pcm ramp as slope", "ota type II", "op-amp with two poles", "ideal op-amp named", "dcm forced"];

    private static LoopDesign Design(string name) => name switch
    {
        "pcm with ramp as mc and delay fraction" => TestStages.Design(TestStages.PointOfLoad(), new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.Mc, 1.35), 40e-9, 0.05), TestStages.TypeII(40e3, 3e3, 250e3)),
        "pcm ramp as slope" => TestStages.Design(TestStages.PointOfLoad(), new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.VoltsPerSecond, 5e4)), TestStages.TypeII(40e3, 3e3, 250e3)),
        "ota type II" => TestStages.Design(TestStages.PointOfLoad(), TestStages.HalfOffSlope(0.1), new TransconductanceNetwork(CompensatorType.TypeII, new Transconductance(1e-3, 5e6), 3.3e-9, 22e3, 47e-12)),
        "op-amp with two poles" => TestStages.Design(TestStages.PointOfLoad(), new VoltageModeControl(1.0, ModulatorDelayFractionOfPeriod: 0.25), new OpAmpNetwork(CompensatorType.TypeIII, 10e3, 4.7e-9, 20e3, 100e-12, 330, 2.2e-9, 3.2e3, new OpAmp(1e5, 10e6, 30e6))),
        "ideal op-amp named" => TestStages.Design(TestStages.PointOfLoad(), new VoltageModeControl(1.0), new OpAmpNetwork(CompensatorType.TypeII, 10e3, 4.7e-9, 20e3, 100e-12, Amplifier: IdealOpAmp.Instance)),
        "dcm forced" => TestStages.Design(TestStages.DiodeRail(), new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(Load: LoadCorner.Min, ConductionModel: ConductionModelChoice.Discontinuous)),
        _ => throw new ArgumentException("unknown design " + name, nameof(name)),
    };

    [Theory]
    [MemberData(nameof(Designs))]
    public void Version_2_fields_round_trip_exactly(string name)
    {
        var design = Design(name);
        string text = DesignFile.Write(design);
        Assert.Contains("\"version\": 2", text, StringComparison.Ordinal);
        var back = DesignFile.Read(text);
        Assert.True(back.Errors.IsEmpty, string.Join("\n", back.Errors));
        Assert.Equal(DesignFile.Write(design), DesignFile.Write(back.Design!));
        Assert.Equal(Describe(design.Plant), Describe(back.Design!.Plant));
        Assert.Equal(design.Analysis, back.Design.Analysis);
        Assert.Equal(design.Compensator, back.Design.Compensator);
    }

    [Theory]
    [InlineData("\"scheme\": \"voltageMode\"", "\"scheme\": \"peakCurrentMode\", \"senseGainOhm\": 0.1", "$.plant.control.scheme")]
    [InlineData("\"modulatorDelayS\": 0", "\"modulatorDelayS\": 0, \"modulatorDelayFractionOfPeriod\": 0.5", "$.plant.control.modulatorDelayFractionOfPeriod")]
    [InlineData("\"rBottomOhm\": 10000", "\"rBottomOhm\": 10000, \"amplifier\": { \"kind\": \"opAmp\", \"openLoopGain\": 1e4, \"gainBandwidthHz\": 1e6 }", "$.compensator.amplifier")]
    [InlineData("\"points\": 1000", "\"points\": 1000, \"conductionModel\": \"ccm\"", "$.analysis.conductionModel")]
    public void A_version_1_file_refuses_version_2_fields_by_path(string find, string replace, string path)
    {
        string v1 = Version1File();
        Assert.True(DesignFile.Read(v1).Errors.IsEmpty, string.Join("\n", DesignFile.Read(v1).Errors));
        Assert.Contains(find, v1, StringComparison.Ordinal);
        var result = DesignFile.Read(v1.Replace(find, replace, StringComparison.Ordinal));
        Assert.Null(result.Design);
        Assert.Contains(result.Errors, e => e.Field == path && e.Message.Contains("version 2", StringComparison.Ordinal));

        // The same text as version 2 reads.
        var two = DesignFile.Read(v1.Replace(find, replace, StringComparison.Ordinal).Replace("\"version\": 1", "\"version\": 2", StringComparison.Ordinal));
        Assert.DoesNotContain(two.Errors, e => e.Field == path);
    }

    [Fact]
    public void Version_1_files_read_unchanged()
    {
        var read = DesignFile.Read(Version1File());
        var design = read.Design!;
        var control = Assert.IsType<VoltageModeControl>(((BuckPlant)design.Plant).Control);
        Assert.Equal(0.0, control.ModulatorDelayFractionOfPeriod);
        Assert.Equal(ConductionModelChoice.Automatic, design.Analysis.ConductionModel);
        Assert.Null(((OpAmpNetwork)design.Compensator).Amplifier);
    }

    [Fact]
    public void Peak_current_mode_example_reports_Qp_and_its_model()
    {
        var design = DesignFile.Read(File.ReadAllText(Path.Combine(ExamplesDir, "pol-12v-to-3v3-peak-current-mode.json"))).Design!;
        var report = AnalysisReport.From(DesignAnalyzer.Analyze(design));
        Assert.True(report.Valid);
        Assert.Equal("peakCurrentMode", report.ControlScheme);
        Assert.Equal("peakCurrentModeCcm", report.SmallSignalModel);
        Assert.InRange(report.CurrentMode!.Qp!.Value, 0.5, 2.0);
        Assert.NotNull(report.IdealAmplifier);
        string text = AnalysisReportText.Write(report);
        Assert.Contains("Qp", text, StringComparison.Ordinal);
        Assert.Contains("peak current mode, CCM (Ridley 1991)", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Dcm_example_uses_the_dcm_model_at_light_load_and_ccm_at_full_load()
    {
        var design = DesignFile.Read(File.ReadAllText(Path.Combine(ExamplesDir, "sensor-24v-to-5v-light-load-dcm.json"))).Design!;
        var report = AnalysisReport.From(DesignAnalyzer.Analyze(design));
        Assert.True(report.Valid);
        Assert.Equal("voltageModeDcm", report.SmallSignalModel);
        Assert.All(report.Corners.Where(c => c.Load == "min"), c => Assert.Equal("voltageModeDcm", c.Model));
        Assert.All(report.Corners.Where(c => c.Load == "max"), c => Assert.Equal("voltageModeCcm", c.Model));
        Assert.Contains(report.Warnings, w => w.StartsWith("DCM", StringComparison.Ordinal));
    }

    /// <summary>The control record and feedback (records with arrays compare by reference, so the stage is compared by its file text).</summary>
    private static string Describe(Plant plant) => plant is BuckPlant b ? $"{b.Control} {b.Feedback}" : plant.ToString()!;

    private static string Version1File() => """
        {
          "format": "loopshaper-design",
          "version": 1,
          "name": "v1",
          "plant": {
            "model": "buck",
            "powerStage": {
              "inputVoltageV": { "min": 10.8, "nominal": 12, "max": 13.2 },
              "outputVoltageV": 3.3,
              "loadCurrentA": { "min": 0.5, "max": 5 },
              "switchingFrequencyHz": 500000,
              "inductor": { "inductanceH": 4.7e-6, "dcrOhm": 0.012 },
              "outputCapacitors": [ { "label": "c", "count": 2, "capacitanceF": 4e-5, "esrOhm": 0.003 } ],
              "highSideOnResistanceOhm": 0.018,
              "rectifier": { "kind": "synchronous", "onResistanceOhm": 0.008 }
            },
            "control": { "scheme": "voltageMode", "rampAmplitudeV": 1, "modulatorDelayS": 0 },
            "feedback": { "topOhm": 10000, "bottomOhm": 3200, "referenceV": 0.8 }
          },
          "compensator": { "form": "opAmpNetwork", "type": "typeII", "r1Ohm": 10000, "c1F": 4.7e-9, "r2Ohm": 20000, "c2F": 1e-10, "rBottomOhm": 10000 },
          "analysis": { "points": 1000 }
        }
        """;

    private static string FindExamples()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "LoopShaper.sln")))
            {
                return Path.Combine(dir.FullName, "docs", "examples");
            }
        }

        throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory);
    }
}
