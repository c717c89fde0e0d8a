using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Synthesis.Tests;

/// <summary>Plants and designs of our own for the synthesis tests.</summary>
internal static class TestPlants
{
    /// <summary>
    /// A 12 V to 1.2 V, 6 A, 600 kHz synchronous buck: 1 uH with 4 mOhm DCR, three 22 uF ceramics and a 220 uF polymer.
    /// f0 = 1 / (2 pi sqrt(1 uH x 286 uF)) = 9.4 kHz; the polymer's ESR zero 1 / (2 pi 15 mOhm 220 uF) = 48 kHz.
    /// </summary>
    public static BuckPowerStage Stage() => new(
        new VoltageRange(10.0, 12.0, 14.0),
        1.2,
        new CurrentRange(0.3, 6.0),
        600e3,
        new Inductor(1.0e-6, 4e-3),
        [new CapacitorBranch("ceramic 22u 0805", 3, 22e-6, 4e-3, 0.4e-9), new CapacitorBranch("polymer 220u", 1, 220e-6, 15e-3, 1.5e-9)],
        12e-3,
        Rectifier.Synchronous(5e-3),
        0.9);

    /// <summary>The stage with a 1.2 V ramp and a 10 k / 10 k divider to a 0.6 V reference, analysed from 10 Hz to 10 MHz.</summary>
    public static LoopDesign Buck(Compensator compensator, BuckPowerStage? stage = null, VoltageModeControl? control = null) => new(
        "1V2 rail",
        "test rail of our own",
        new BuckPlant(stage ?? Stage(), control ?? new VoltageModeControl(1.2), new FeedbackDivider(10e3, 10e3, 0.6)),
        compensator,
        new AnalysisSettings(StartHz: 10, StopHz: 10e6),
        new DesignCriteria());

    /// <summary>A placeholder compensator for building the plant of a design (the plant does not depend on it).</summary>
    public static CompensatorPlacement AnyPlacement { get; } = new(CompensatorType.TypeI, new GainSetting(GainSettingKind.IntegratorHz, 1e3));

    /// <summary>Fm Gvd of <see cref="Buck"/>.</summary>
    public static TransferFunction BuckPlant() => DesignAnalyzer.BuildLoop(Buck(AnyPlacement)).Loop.Plant;

    /// <summary>
    /// A stand-in for a peak-current-mode control-to-output function (our own numbers): gain 8, load pole 1.5 kHz,
    /// ESR zero 30 kHz, the sampling double pole at fs / 2 = 300 kHz with Q = 0.64.
    /// </summary>
    public static TransferFunction CurrentModePlant() => TransferFunction.FromFactors(8.0, 0, [Factor.Real(30e3)], [Factor.Real(1.5e3), Factor.Pair(300e3, 0.64)]);
}
