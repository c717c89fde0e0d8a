using System.Numerics;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Models.Tests;

/// <summary>Power stages and designs of our own for the model tests.</summary>
internal static class TestStages
{
    /// <summary>
    /// A lossless buck (no switch or inductor resistance, no diode drop, one capacitor without ESR or ESL), so that the
    /// handbook's lossless formulas apply exactly.
    /// </summary>
    public static BuckPowerStage Lossless(double vin, double vout, double loadA, double inductanceH, double capacitanceF, double fsHz, RectifierKind rectifier = RectifierKind.Synchronous)
        => new(
            new VoltageRange(vin, vin, vin),
            vout,
            new CurrentRange(loadA, loadA),
            fsHz,
            new Inductor(inductanceH, 0.0),
            [new CapacitorBranch("ideal", 1, capacitanceF, 0.0)],
            0.0,
            new Rectifier(rectifier, 0.0, 0.0),
            0.99);

    /// <summary>A 12 V to 3.3 V, 500 kHz synchronous rail with every parasitic (our scenario).</summary>
    public static BuckPowerStage PointOfLoad() => new(
        new VoltageRange(10.8, 12.0, 13.2),
        3.3,
        new CurrentRange(0.5, 5.0),
        500e3,
        new Inductor(4.7e-6, 12e-3),
        [new CapacitorBranch("ceramic 47u 1210", 2, 40e-6, 3e-3, 0.5e-9), new CapacitorBranch("polymer 220u", 1, 220e-6, 15e-3, 2e-9)],
        18e-3,
        Rectifier.Synchronous(8e-3),
        0.9);

    /// <summary>A 24 V to 5 V, 300 kHz rail with a Schottky diode that enters DCM at light load (our scenario).</summary>
    public static BuckPowerStage DiodeRail() => new(
        new VoltageRange(18.0, 24.0, 30.0),
        5.0,
        new CurrentRange(0.1, 3.0),
        300e3,
        new Inductor(22e-6, 35e-3),
        [new CapacitorBranch("ceramic 22u", 3, 18e-6, 4e-3, 0.8e-9)],
        40e-3,
        Rectifier.Diode(0.45, 0.0),
        0.9);

    public static FeedbackDivider Divider(double vout, double vref = 0.8, double topOhm = 10e3) => new(topOhm, topOhm * vref / (vout - vref), vref);

    /// <summary>Peak current mode with Ri = 0.25 V/A and Se = Sf / 2.</summary>
    public static PeakCurrentModeControl HalfOffSlope(double ri = 0.25) => new(ri, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.5));

    public static LoopDesign Design(BuckPowerStage stage, PwmControl control, Compensator compensator, AnalysisSettings? analysis = null)
        => new("test", "model tests", new BuckPlant(stage, control, Divider(stage.OutputVoltageV)), compensator, analysis ?? new AnalysisSettings(StartHz: 10, StopHz: 1e7), new DesignCriteria());

    /// <summary>A Type II placement with its gain set by a crossover target.</summary>
    public static CompensatorPlacement TypeII(double crossoverHz, double zeroHz, double poleHz)
        => new(CompensatorType.TypeII, new GainSetting(GainSettingKind.CrossoverHz, crossoverHz), Zero1Hz: zeroHz, Pole1Hz: poleHz);

    /// <summary>The admittance of the output bank and load at s: 1/R + sum of s C / (1 + s ESR C + s^2 ESL C), evaluated directly.</summary>
    public static Complex Admittance(BuckPowerStage stage, double? loadOhm, Complex s)
    {
        var y = new Complex(loadOhm is double r ? 1.0 / r : 0.0, 0);
        foreach (var b in stage.OutputCapacitors)
        {
            double c = b.TotalCapacitanceF;
            y += s * c / (1 + (s * b.TotalEsrOhm * c) + (s * s * b.TotalEslH * c));
        }

        return y;
    }

    /// <summary>Poles of a function whose magnitude lies between two frequencies, rad/s.</summary>
    public static IEnumerable<Complex> PolesBetween(TransferFunction h, double lowHz, double highHz)
        => h.Poles.Where(p => p.Magnitude >= 2 * Math.PI * lowHz && p.Magnitude <= 2 * Math.PI * highHz);

    /// <summary>The quality factor of a complex pole pair: |p| / (-2 Re p).</summary>
    public static double QualityOf(Complex pole) => pole.Magnitude / (-2 * pole.Real);
}
