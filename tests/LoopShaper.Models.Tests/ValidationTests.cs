using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;

namespace LoopShaper.Models.Tests;

/// <summary>Bad inputs of the new models get an error that names the design-file field and says what is allowed; the analysis never throws.</summary>
public class ValidationTests
{
    private static LoopDesign Pcm(PeakCurrentModeControl control, Compensator? compensator = null, AnalysisSettings? analysis = null)
        => TestStages.Design(TestStages.PointOfLoad(), control, compensator ?? TestStages.TypeII(40e3, 3e3, 250e3), analysis);

    private static LoopDesign Ota(Transconductance amplifier, CompensatorType type = CompensatorType.TypeII)
        => TestStages.Design(TestStages.PointOfLoad(), TestStages.HalfOffSlope(0.1), new TransconductanceNetwork(type, amplifier, 10e-9, 20e3, 47e-12));

    private static LoopDesign OpAmpDesign(ErrorAmplifier amplifier)
        => TestStages.Design(TestStages.PointOfLoad(), new VoltageModeControl(1.0), new OpAmpNetwork(CompensatorType.TypeIII, 10e3, 4.7e-9, 20e3, 100e-12, 330, 2.2e-9, Amplifier: amplifier));

    public static TheoryData<string, string, string> Cases() => new()
    {
        { "negative ramp slope", "plant.control.ramp.value", "negative" },
        { "mc below one", "plant.control.ramp.value", "mc below 1" },
        { "negative multiple of Sf", "plant.control.ramp.value", "negative" },
        { "zero sense gain", "plant.control.senseGainOhm", "above 0" },
        { "NaN sense gain", "plant.control.senseGainOhm", "finite" },
        { "negative delay fraction", "plant.control.modulatorDelayFractionOfPeriod", "out of range" },
        { "gm too large", "compensator.amplifier.transconductanceS", "out of range" },
        { "gm zero", "compensator.amplifier.transconductanceS", "out of range" },
        { "Ro too small", "compensator.amplifier.outputResistanceOhm", "out of range" },
        { "OTA Type III", "compensator.type", "Type I or Type II" },
        { "OTA in an op-amp network", "compensator.amplifier.kind", "transconductance" },
        { "open-loop gain too low", "compensator.amplifier.openLoopGain", "out of range" },
        { "GBW zero", "compensator.amplifier.gainBandwidthHz", "out of range" },
        { "second pole below the dominant pole", "compensator.amplifier.secondPoleHz", "above the dominant pole" },
        { "DCM forced on a synchronous rectifier", "analysis.conductionModel", "synchronous rectifier" },
        { "DCM forced at a CCM point", "analysis.conductionModel", "above the CCM/DCM boundary" },
        { "no load in DCM", "analysis.load", "skips pulses" },
    };

    private static LoopDesign Case(string name) => name switch
    {
        "negative ramp slope" => Pcm(new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.VoltsPerSecond, -1e5))),
        "mc below one" => Pcm(new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.Mc, 0.8))),
        "negative multiple of Sf" => Pcm(new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, -0.5))),
        "zero sense gain" => Pcm(new PeakCurrentModeControl(0.0, CompensationRamp.None)),
        "NaN sense gain" => Pcm(new PeakCurrentModeControl(double.NaN, CompensationRamp.None)),
        "negative delay fraction" => Pcm(new PeakCurrentModeControl(0.1, CompensationRamp.None, ModulatorDelayFractionOfPeriod: -0.1)),
        "gm too large" => Ota(new Transconductance(10.0, 1e6)),
        "gm zero" => Ota(new Transconductance(0.0, 1e6)),
        "Ro too small" => Ota(new Transconductance(200e-6, 10)),
        "OTA Type III" => Ota(new Transconductance(200e-6, 1e6), CompensatorType.TypeIII),
        "OTA in an op-amp network" => OpAmpDesign(new Transconductance(200e-6, 1e6)),
        "open-loop gain too low" => OpAmpDesign(new OpAmp(1.0, 1e6)),
        "GBW zero" => OpAmpDesign(new OpAmp(1e4, 0.0)),
        "second pole below the dominant pole" => OpAmpDesign(new OpAmp(1e3, 1e7, 2e3)),
        "DCM forced on a synchronous rectifier" => Pcm(TestStages.HalfOffSlope(), analysis: new AnalysisSettings(ConductionModel: ConductionModelChoice.Discontinuous)),
        "DCM forced at a CCM point" => TestStages.Design(TestStages.DiodeRail(), new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(ConductionModel: ConductionModelChoice.Discontinuous)),
        "no load in DCM" => TestStages.Design(TestStages.DiodeRail() with { LoadCurrent = new CurrentRange(0.0, 3.0) }, new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(Load: LoadCorner.Min)),
        _ => throw new ArgumentException("unknown case " + name, nameof(name)),
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Bad_input_gets_a_field_named_error(string name, string field, string words)
    {
        var design = Case(name);
        var errors = DesignValidator.Validate(design).Where(i => i.Severity == Severity.Error).ToList();
        Assert.Contains(errors, e => e.Field == field && e.Message.Contains(words, StringComparison.Ordinal));
        Assert.All(errors, e => Assert.DoesNotContain("NaN", e.Message, StringComparison.Ordinal));

        var analysis = DesignAnalyzer.Analyze(design);
        Assert.False(analysis.IsValid);
        Assert.Contains(analysis.Issues, i => i.Field == field);
    }

    [Fact]
    public void Good_designs_of_each_kind_pass()
    {
        foreach (var design in new[]
        {
            Pcm(TestStages.HalfOffSlope(0.1)),
            Ota(new Transconductance(200e-6, 5e6)),
            OpAmpDesign(new OpAmp(1e4, 5e6, 20e6)),
            TestStages.Design(TestStages.DiodeRail(), new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(Load: LoadCorner.Min, ConductionModel: ConductionModelChoice.Discontinuous)),
        })
        {
            Assert.DoesNotContain(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
            Assert.True(DesignAnalyzer.Analyze(design).IsValid);
        }
    }
}
