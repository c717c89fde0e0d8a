using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Physics.Tests;

/// <summary>Valid designs of our own that the validation tests start from and break one field at a time.</summary>
internal static class TestDesigns
{
    /// <summary>f0 = 5 kHz, Q = 2, gain 12: a stand-in for a buck's control-to-output function with its modulator.</summary>
    private const double CustomW0 = 2 * Math.PI * 5e3;

    /// <summary>The 12 V to 3.3 V stage of <see cref="TestStages.Lossy"/> with a fixed 1 V ramp and an op-amp Type III network.</summary>
    public static LoopDesign Buck() => new(
        "3V3 rail",
        "point-of-load rail of our own",
        new BuckPlant(TestStages.Lossy(), new VoltageModeControl(1.0), new FeedbackDivider(10e3, 10e3 * 0.6 / 2.7, 0.6)),
        new OpAmpNetwork(CompensatorType.TypeIII, R1Ohm: 10e3, C1F: 3.9e-9, R2Ohm: 10e3, C2F: 68e-12, R3Ohm: 160, C3F: 3.9e-9),
        new AnalysisSettings(),
        new DesignCriteria());

    /// <summary>A custom plant in coefficient form with a Type III placement set by a crossover target.</summary>
    public static LoopDesign CustomCoefficients() => new(
        "custom plant",
        "entered by hand",
        new CustomPlant(
            CustomPlantForm.Coefficients,
            [12.0],
            [1.0 / (CustomW0 * CustomW0), 1.0 / (2.0 * CustomW0), 1.0],
            0.0,
            0,
            [],
            [],
            0.0,
            0.5,
            500e3),
        new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.CrossoverHz, 30e3), 4e3, 4e3, 100e3, 250e3),
        new AnalysisSettings(),
        new DesignCriteria());

    /// <summary>The same plant in factor form, with an ESR-like zero and a delay, and a Type II placement by mid-band gain.</summary>
    public static LoopDesign CustomFactors() => new(
        "custom plant, factors",
        "entered by hand",
        new CustomPlant(CustomPlantForm.Factors, [], [], 12.0, 0, [Factor.Real(100e3)], [Factor.Pair(5e3, 2.0)], 200e-9, 0.5, 500e3),
        new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.MidbandGainDb, 6.0), Zero1Hz: 3e3, Pole1Hz: 150e3),
        new AnalysisSettings(),
        new DesignCriteria());

    /// <summary>The buck design with its power stage changed.</summary>
    public static LoopDesign WithStage(this LoopDesign d, Func<BuckPowerStage, BuckPowerStage> change)
    {
        var buck = (BuckPlant)d.Plant;
        return d with { Plant = buck with { PowerStage = change(buck.PowerStage) } };
    }

    /// <summary>The buck design with its modulator changed.</summary>
    public static LoopDesign WithControl(this LoopDesign d, Func<VoltageModeControl, VoltageModeControl> change)
    {
        var buck = (BuckPlant)d.Plant;
        return d with { Plant = buck with { Control = change((VoltageModeControl)buck.Control) } };
    }

    /// <summary>The buck design with its divider changed.</summary>
    public static LoopDesign WithFeedback(this LoopDesign d, Func<FeedbackDivider, FeedbackDivider> change)
    {
        var buck = (BuckPlant)d.Plant;
        return d with { Plant = buck with { Feedback = change(buck.Feedback) } };
    }

    /// <summary>The custom design with its plant changed.</summary>
    public static LoopDesign WithCustom(this LoopDesign d, Func<CustomPlant, CustomPlant> change)
        => d with { Plant = change((CustomPlant)d.Plant) };

    /// <summary>The design with its op-amp network changed.</summary>
    public static LoopDesign WithNetwork(this LoopDesign d, Func<OpAmpNetwork, OpAmpNetwork> change)
        => d with { Compensator = change((OpAmpNetwork)d.Compensator) };

    /// <summary>The design with its compensator placement changed.</summary>
    public static LoopDesign WithPlacement(this LoopDesign d, Func<CompensatorPlacement, CompensatorPlacement> change)
        => d with { Compensator = change((CompensatorPlacement)d.Compensator) };

    /// <summary>One capacitor branch replaced.</summary>
    public static LoopDesign WithCapacitor(this LoopDesign d, int index, Func<CapacitorBranch, CapacitorBranch> change)
        => d.WithStage(s => s with { OutputCapacitors = s.OutputCapacitors.SetItem(index, change(s.OutputCapacitors[index])) });
}
