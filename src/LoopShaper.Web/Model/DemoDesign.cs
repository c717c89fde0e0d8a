using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Web.Model;

/// <summary>
/// The design the workspace opens with: a 1.2 V processor-core rail from a 12 V bus, 10 A, 500 kHz, a mixed
/// ceramic and polymer output bank, Type III compensation placed around the output filter (a scenario of our own).
/// </summary>
public sealed class DemoDesign
{
    /// <summary>The demo design.</summary>
    public LoopDesign Design { get; } = Create();

    /// <summary>Builds the demo design.</summary>
    public static LoopDesign Create() => new(
        "Processor core rail 1.2 V / 10 A",
        "12 V bus to 1.2 V core supply, synchronous buck at 500 kHz, voltage mode with Type III compensation.",
        new BuckPlant(
            new BuckPowerStage(
                new VoltageRange(10.8, 12.0, 13.2),
                1.2,
                new CurrentRange(0.5, 10.0),
                500e3,
                new Inductor(0.68e-6, 0.002),
                [new CapacitorBranch("ceramic 47u 1206", 4, 47e-6, 0.003, 0.5e-9), new CapacitorBranch("polymer 330u", 1, 330e-6, 0.009, 1.5e-9)],
                0.008,
                Rectifier.Synchronous(0.003)),
            new VoltageModeControl(1.0),
            new FeedbackDivider(10e3, 10e3, 0.6)),
        new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.CrossoverHz, 50e3), Zero1Hz: 4e3, Zero2Hz: 8e3, Pole1Hz: 150e3, Pole2Hz: 250e3),
        new AnalysisSettings(StartHz: 100, StopHz: 2e6, LoadStepA: 5.0),
        new DesignCriteria());
}
