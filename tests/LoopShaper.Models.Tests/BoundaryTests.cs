using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>
/// The loop across the CCM/DCM boundary of a diode rectifier. Each model must have a clean limit on its own side of the
/// boundary (no singularity as K approaches Kcrit). Whether the two sides meet is physics, not numerics: the DC gain of
/// any averaged model is the slope of the large-signal characteristic, and for voltage mode that slope has a kink at
/// the boundary (M = D in CCM, M = 2 / (1 + sqrt(1 + 4K/D^2)) in DCM, Erickson and Maksimovic, 2nd ed., ch. 5), so the
/// voltage-mode loop jumps there; in peak current mode without a ramp the low-frequency gain and the load pole are
/// continuous, and the margins nearly so.
/// </summary>
public class BoundaryTests
{
    private const double Vin = 12.0, Vout = 5.0, L = 10e-6, C = 100e-6, Fs = 200e3, D = Vout / Vin;

    private static BuckPowerStage Stage(double loadA)
        => TestStages.Lossless(Vin, Vout, loadA, L, C, Fs, RectifierKind.Diode) with { OutputCapacitors = [new CapacitorBranch("ceramic", 1, C, 5e-3)] };

    private static double BoundaryA => Vout * (1 - D) / (2 * L * Fs);

    private static LoopDesign Design(double loadA, PwmControl control)
    {
        Compensator comp = control is VoltageModeControl
            ? new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.IntegratorHz, 2000), 1.5e3, 1.5e3, 50e3, 100e3)
            : new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 300), 500, null, 50e3);
        return TestStages.Design(Stage(loadA), control, comp, new AnalysisSettings(StartHz: 1, StopHz: 1e7));
    }

    private static (AssembledLoop Loop, StabilityMargins Margins) At(double factor, PwmControl control)
    {
        var built = DesignAnalyzer.BuildLoop(Design(factor * BoundaryA, control));
        return (built, MarginAnalyzer.Analyze(built.Loop.LoopGain, 1, 1e7));
    }

    public static TheoryData<string> Schemes() => ["voltage", "pcm", "pcm-ramp"];

    private static PwmControl Control(string scheme) => scheme switch
    {
        "voltage" => new VoltageModeControl(1.0),
        "pcm" => new PeakCurrentModeControl(0.2, CompensationRamp.None),
        _ => new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.5)),
    };

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Each_side_has_a_clean_limit_at_the_boundary(string scheme)
    {
        // Approaching the boundary from either side the margins settle: from 1e-3 to 1e-5 of the boundary load the
        // crossover moves by less than 0.1 % and the phase margin by less than 0.05 degrees (no pole or zero runs away).
        foreach (double side in new[] { -1.0, +1.0 })
        {
            var near = At(1 + (side * 1e-3), Control(scheme));
            var nearer = At(1 + (side * 1e-5), Control(scheme));
            Assert.Equal(side < 0, near.Loop.OperatingPoint!.Mode == ConductionMode.Discontinuous);
            Assert.Equal(near.Loop.Model, nearer.Loop.Model);
            Assert.InRange(nearer.Margins.CrossoverHz!.Value / near.Margins.CrossoverHz!.Value, 0.999, 1.001);
            Assert.InRange(nearer.Margins.PhaseMarginDeg!.Value - near.Margins.PhaseMarginDeg!.Value, -0.05, 0.05);
        }
    }

    [Fact]
    public void Operating_point_is_continuous_at_the_boundary()
    {
        // At the boundary the DCM solution meets the CCM one: D -> Vout / Vin, D2 -> D', the valley -> 0.
        var op = BuckOperatingPoint.Solve(Stage((1 - 1e-9) * BoundaryA), new OperatingCondition(Vin, (1 - 1e-9) * BoundaryA));
        Assert.Equal(ConductionMode.Discontinuous, op.Mode);
        Assert.Equal(D, op.DutyCycle, 8);
        Assert.Equal(1 - D, op.RectifierConductionFraction!.Value, 8);
        Assert.Equal(2 * BoundaryA, op.PeakInductorCurrentA, 8);
    }

    [Fact]
    public void Voltage_mode_dc_gain_jumps_by_the_kink_of_the_large_signal_characteristic()
    {
        // CCM: Gvd(0) = Vin (dV/dD of V = D Vin). DCM: Gvd(0) must be Vin dM/dD of M = 2 / (1 + sqrt(1 + 4K/D^2))
        // at fixed K (Erickson & Maksimovic, 2nd ed., sec. 5.2), here by a one-sided finite difference at the
        // boundary D = 1 - K; its closed form there is 2 (1 - D) / (2 - D) (our derivation).
        double k = 1 - D;
        static double M(double k, double d) => 2.0 / (1.0 + Math.Sqrt(1.0 + (4.0 * k / (d * d))));
        double h = 1e-7;
        double slope = (M(k, D) - M(k, D - h)) / h;
        Assert.Equal(2 * (1 - D) / (2 - D), slope, 1e-5);

        var dcm = At(1 - 1e-6, new VoltageModeControl(1.0)).Loop.Loop.ControlToOutput.DcGain!.Value;
        var ccm = At(1 + 1e-6, new VoltageModeControl(1.0)).Loop.Loop.ControlToOutput.DcGain!.Value;
        Assert.Equal(Vin, ccm, 1e-9);
        Assert.Equal(Vin * slope, dcm, 1e-4);
    }

    [Fact]
    public void Voltage_mode_margins_jump_at_the_boundary()
    {
        // The consequence: in CCM at the boundary the L C pair is barely damped (Q about 16 here: 1/Q = sqrt(L/C)/R + ESR sqrt(C/L); the ESR zero
        // at 318 kHz) while in DCM the inductor pole has moved to 2 fs / D2: the loop is a different loop. This design
        // keeps more than 30 degrees just inside DCM and loses all of it just inside CCM.
        var dcm = At(1 - 1e-6, new VoltageModeControl(1.0));
        var ccm = At(1 + 1e-6, new VoltageModeControl(1.0));
        Assert.Equal(SmallSignalModel.VoltageModeDiscontinuous, dcm.Loop.Model);
        Assert.Equal(SmallSignalModel.VoltageModeContinuous, ccm.Loop.Model);
        Assert.True(dcm.Margins.PhaseMarginDeg > 30, $"DCM side: {dcm.Margins.PhaseMarginDeg}");
        Assert.True(ccm.Margins.PhaseMarginDeg < 5, $"CCM side: {ccm.Margins.PhaseMarginDeg}");
        var warned = DesignAnalyzer.Analyze(Design(1.05 * BoundaryA, new VoltageModeControl(1.0)));
        Assert.Contains(warned.Warnings, w => w.Contains("CCM/DCM boundary", StringComparison.Ordinal));
    }

    [Fact]
    public void Peak_current_mode_without_ramp_is_continuous_at_the_boundary()
    {
        // Without a ramp both models give, at the boundary (K = D'), the DC gain R D' / (Ri (2 - 3D)) and the load pole
        // (2 - 3D) / (D' R C) (our derivation: Ridley's DC gain and pole with R Ts / L = 2 / D', and the DCM model with
        // d = vc / (Sn Ts) reduced to first order). The full-order DCM pole sits within wp / w2 (about 0.2 %) of it.
        // The margins follow within 1 % in crossover and 3 degrees in phase: what remains differs at high frequency
        // (the sampling double pole at fs/2 in CCM, the inductor pole at 2 fs / D2 in DCM).
        var control = new PeakCurrentModeControl(0.2, CompensationRamp.None);
        var dcm = At(1 - 1e-6, control);
        var ccm = At(1 + 1e-6, control);
        double r = Vout / BoundaryA;
        double gain = r * (1 - D) / (0.2 * (2 - (3 * D)));
        double wp = (2 - (3 * D)) / ((1 - D) * r * C);
        foreach (var side in new[] { dcm, ccm })
        {
            Assert.Equal(gain, side.Loop.Loop.ControlToOutput.DcGain!.Value, gain * 1e-4);
            var pole = side.Loop.Loop.ControlToOutput.Poles.Where(p => p.Imaginary == 0).MinBy(p => p.Magnitude);
            Assert.InRange(pole.Magnitude / wp, 0.995, 1.005);
        }

        Assert.InRange(ccm.Margins.CrossoverHz!.Value / dcm.Margins.CrossoverHz!.Value, 0.99, 1.01);
        Assert.InRange(ccm.Margins.PhaseMarginDeg!.Value - dcm.Margins.PhaseMarginDeg!.Value, -3.0, 3.0);
    }

    [Fact]
    public void Peak_current_mode_with_a_ramp_moves_at_the_boundary_as_derived()
    {
        // With a ramp the sampled-data correction of Ridley's model (kr, He) has no counterpart in DCM, where the current
        // starts from zero each period: at the boundary the DC gains are R D' / (Ri (2 mc D' - D)) in CCM and
        // R D' / (Ri (mc (2 - D) - 2 D)) in DCM (our derivation), equal only for mc = 1.
        var control = new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.5));
        var dcm = At(1 - 1e-6, control);
        var ccm = At(1 + 1e-6, control);
        double r = Vout / BoundaryA, mc = 1 + (0.5 * D / (1 - D));
        Assert.Equal(mc, ccm.Loop.CurrentMode!.Mc, 1e-6);
        Assert.Equal(r * (1 - D) / (0.2 * ((2 * mc * (1 - D)) - D)), ccm.Loop.Loop.ControlToOutput.DcGain!.Value, 1e-3);
        Assert.Equal(r * (1 - D) / (0.2 * ((mc * (2 - D)) - (2 * D))), dcm.Loop.Loop.ControlToOutput.DcGain!.Value, 1e-3);
    }
}
