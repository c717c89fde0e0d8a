using LoopShaper.Core.PlantModels;

namespace LoopShaper.Physics.Tests;

/// <summary>Power stages of our own used by several physics tests.</summary>
internal static class TestStages
{
    /// <summary>A buck without any loss: no on-resistance, no DCR, no ESR or ESL, synchronous rectifier.</summary>
    public static BuckPowerStage Lossless(double vinV, double voutV, double loadA, double inductanceH, double capacitanceF, double switchingHz)
        => new(
            new VoltageRange(vinV, vinV, vinV),
            voutV,
            new CurrentRange(loadA, loadA),
            switchingHz,
            new Inductor(inductanceH, 0.0),
            [new CapacitorBranch("ideal", 1, capacitanceF, 0.0)],
            0.0,
            Rectifier.Synchronous(0.0));

    /// <summary>
    /// A 12 V to 3.3 V, 10 A, 500 kHz synchronous buck with every loss the model knows: switch resistances, DCR,
    /// a ceramic bank with ESR and ESL and a polymer capacitor.
    /// </summary>
    public static BuckPowerStage Lossy() => new(
        new VoltageRange(10.8, 12.0, 13.2),
        3.3,
        new CurrentRange(0.5, 10.0),
        500e3,
        new Inductor(1.5e-6, 3e-3),
        [new CapacitorBranch("ceramic 47u 1210", 4, 47e-6, 3e-3, 0.5e-9), new CapacitorBranch("polymer 330u", 1, 330e-6, 10e-3, 2e-9)],
        8e-3,
        Rectifier.Synchronous(4e-3),
        0.9);
}
