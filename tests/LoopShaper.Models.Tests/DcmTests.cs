using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>
/// The DCM operating point and small-signal model against R. W. Erickson, D. Maksimovic, Fundamentals of Power
/// Electronics, 2nd ed., ch. 5 (CCM/DCM boundary, conversion ratio) and ch. 11 (averaged DCM model), and the full-order
/// model of Sun et al., IEEE Trans. Power Electronics 16(4), 2001.
/// </summary>
public class DcmTests
{
    private const double Vin = 12.0, Vout = 5.0, L = 10e-6, C = 100e-6, Fs = 200e3;

    private static BuckPowerStage Stage(double loadA, double vin = Vin) => TestStages.Lossless(vin, Vout, loadA, L, C, Fs, RectifierKind.Diode);

    private static OperatingPoint Solve(BuckPowerStage stage) => BuckOperatingPoint.Solve(stage, new OperatingCondition(stage.InputVoltage.NominalV, stage.LoadCurrent.MaxA));

    /// <summary>M = 2 / (1 + sqrt(1 + 4K / D^2)) (Erickson &amp; Maksimovic, 2nd ed., sec. 5.2).</summary>
    private static double M(double k, double d) => 2.0 / (1.0 + Math.Sqrt(1.0 + (4.0 * k / (d * d))));

    [Theory]
    [InlineData(12.0)]
    [InlineData(24.0)]
    public void Boundary_is_K_equal_to_Kcrit(double vin)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 5.1: K = 2L / (R Ts), Kcrit = 1 - D; DCM for K < Kcrit.
        var probe = Solve(Stage(1.0, vin));
        double rBoundary = Vout / probe.BoundaryLoadCurrentA;
        Assert.Equal(1 - (Vout / vin), 2 * L * Fs / rBoundary, 12);
        foreach (double factor in new[] { 0.5, 0.99, 0.999 })
        {
            var op = Solve(Stage(factor * probe.BoundaryLoadCurrentA, vin));
            double k = 2 * L * Fs / op.LoadResistanceOhm!.Value;
            Assert.True(k < 1 - op.ContinuousDutyCycle);
            Assert.Equal(ConductionMode.Discontinuous, op.Mode);
            Assert.NotNull(op.RectifierConductionFraction);
        }

        foreach (double factor in new[] { 1.001, 1.01, 2.0 })
        {
            var op = Solve(Stage(factor * probe.BoundaryLoadCurrentA, vin));
            Assert.Equal(ConductionMode.Continuous, op.Mode);
            Assert.Null(op.RectifierConductionFraction);
        }
    }

    [Theory]
    [InlineData(0.05)]
    [InlineData(0.2)]
    [InlineData(0.5)]
    [InlineData(0.72)]
    public void Dcm_duty_cycle_gives_the_handbook_conversion_ratio(double loadA)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 5.2: in DCM, M = V / Vg = 2 / (1 + sqrt(1 + 4K / D^2)). With the solved
        // duty cycle the formula must return Vout / Vin; and D is below the CCM value Vout / Vin.
        var op = Solve(Stage(loadA));
        Assert.Equal(ConductionMode.Discontinuous, op.Mode);
        double k = 2 * L * Fs / (Vout / loadA);
        Assert.Equal(Vout / Vin, M(k, op.DutyCycle), 12);
        Assert.True(op.DutyCycle < Vout / Vin);
        Assert.Equal(Vout / Vin, op.ContinuousDutyCycle, 12);
    }

    [Fact]
    public void Dcm_point_with_a_diode_drop_keeps_volt_second_and_charge_balance()
    {
        // Erickson & Maksimovic, 2nd ed., sec. 5.2 with the diode drop in the off-interval:
        // D (Vin - Vout) = D2 (Vout + Vf) (volt-seconds) and I = Ipk (D + D2) / 2 (the inductor's average is the load).
        var stage = TestStages.DiodeRail();
        var op = BuckOperatingPoint.Solve(stage, new OperatingCondition(24.0, 0.1));
        Assert.Equal(ConductionMode.Discontinuous, op.Mode);
        double d = op.DutyCycle, d2 = op.RectifierConductionFraction!.Value, vf = stage.Rectifier.ForwardDropV;
        Assert.Equal(d * (24.0 - 5.0), d2 * (5.0 + vf), 12);
        Assert.Equal(0.1, op.PeakInductorCurrentA * (d + d2) / 2, 12);
        Assert.Equal((24.0 - 5.0) * d / (stage.Inductor.InductanceH * stage.SwitchingFrequencyHz), op.PeakInductorCurrentA, 12);
        Assert.Equal(0.0, op.ValleyInductorCurrentA);
        Assert.True(d + d2 < 1);
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(0.3)]
    [InlineData(0.6)]
    public void Control_to_output_dc_gain_and_load_pole_match_the_reduced_order_model(double loadA)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 11.3, buck in DCM: Gvd = Gd0 / (1 + s / wp) with
        // Gd0 = 2 V (1 - M) / (D (2 - M)), wp = (2 - M) / ((1 - M) R C). The full-order model equals it at DC exactly
        // (L s = 0 there); its low pole moves from wp by about wp / w2 relative (the inductor pole w2 = Reff / L), which
        // is below 0.5 % at these loads, so the check allows 2 wp / w2.
        var stage = Stage(loadA);
        var op = Solve(stage);
        var tfs = DcmBuck.TransferFunctions(stage, op);
        Assert.Equal(SmallSignalModel.VoltageModeDiscontinuous, tfs.Model);
        double m = Vout / Vin, d = op.DutyCycle, r = Vout / loadA;
        double gd0 = 2 * Vout * (1 - m) / (d * (2 - m));
        Assert.Equal(gd0, tfs.ControlToOutput.DcGain!.Value, gd0 * 1e-9);

        double wp = (2 - m) / ((1 - m) * r * C);
        var poles = tfs.ControlToOutput.Poles.OrderBy(p => p.Magnitude).ToList();
        Assert.Equal(2, poles.Count);
        Assert.True(poles.All(p => p.Imaginary == 0 && p.Real < 0), "two real poles in DCM");
        double w2 = poles[1].Magnitude;
        Assert.InRange(poles[0].Magnitude / wp, 1 - (2 * wp / w2), 1 + (2 * wp / w2));

        // Line to output at DC: Gg0 = M (Erickson & Maksimovic, 2nd ed., sec. 11.3).
        Assert.Equal(m, tfs.LineToOutput.DcGain!.Value, 1e-9);
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(0.3)]
    [InlineData(0.6)]
    public void High_frequency_pole_sits_near_2_fs_over_D2(double loadA)
    {
        // Sun et al. 2001 (from memory): the full-order DCM buck has its second pole at w2 = 2 fs / D2 (rad/s), the
        // inductor current settling within the rectifier interval. The exact pole includes the coupling with the
        // output filter (relative size wp / w2, below 0.5 % here): 1 % allowed.
        var stage = Stage(loadA);
        var op = Solve(stage);
        var tfs = DcmBuck.TransferFunctions(stage, op);
        double expected = 2 * Fs / op.RectifierConductionFraction!.Value;
        double w2 = tfs.ControlToOutput.Poles.Max(p => p.Magnitude);
        Assert.InRange(w2 / expected, 0.99, 1.01);
    }

    [Fact]
    public void Synchronous_rectifier_stays_in_ccm_at_light_load()
    {
        // A synchronous rectifier in forced CCM lets the current reverse: no DCM, the CCM model holds and the valley is negative.
        var stage = TestStages.Lossless(Vin, Vout, 0.05, L, C, Fs, RectifierKind.Synchronous);
        var op = Solve(stage);
        Assert.Equal(ConductionMode.Continuous, op.Mode);
        Assert.True(op.ValleyInductorCurrentA < 0);
        var design = TestStages.Design(stage, new VoltageModeControl(1.0), TestStages.TypeII(10e3, 1e3, 50e3));
        var analysis = DesignAnalyzer.Analyze(design);
        Assert.True(analysis.IsValid, string.Join("; ", analysis.Issues));
        Assert.Equal(SmallSignalModel.VoltageModeContinuous, analysis.Model);
    }

    [Fact]
    public void Dcm_model_is_chosen_automatically_and_each_corner_names_its_model()
    {
        var stage = TestStages.DiodeRail();
        var light = TestStages.Design(stage, new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(StartHz: 10, StopHz: 1e7, Load: LoadCorner.Min));
        var a = DesignAnalyzer.Analyze(light);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        Assert.Equal(ConductionMode.Discontinuous, a.OperatingPoint!.Mode);
        Assert.Equal(SmallSignalModel.VoltageModeDiscontinuous, a.Model);
        Assert.Contains(a.Warnings, w => w.Contains("DCM model", StringComparison.Ordinal));

        Assert.Equal(6, a.Corners.Length);
        Assert.All(a.Corners.Where(c => c.Load == LoadCorner.Min), c => Assert.Equal(SmallSignalModel.VoltageModeDiscontinuous, c.Model));
        Assert.All(a.Corners.Where(c => c.Load == LoadCorner.Max), c => Assert.Equal(SmallSignalModel.VoltageModeContinuous, c.Model));
        Assert.All(a.Corners, c => Assert.NotNull(c.PhaseMarginDeg));

        // Peak current mode in DCM is marked as such.
        var pcm = light with { Plant = ((BuckPlant)light.Plant) with { Control = TestStages.HalfOffSlope(0.5) } };
        var b = DesignAnalyzer.Analyze(pcm);
        Assert.True(b.IsValid, string.Join("; ", b.Issues));
        Assert.Equal(SmallSignalModel.PeakCurrentModeDiscontinuous, b.Model);
        Assert.True(b.CurrentMode!.IsDiscontinuous);
        Assert.Null(b.CurrentMode.Qp);
        Assert.Null(b.CurrentLoopMargins);
    }

    [Fact]
    public void Forcing_the_ccm_model_in_dcm_is_allowed_and_warned()
    {
        var stage = TestStages.DiodeRail();
        var design = TestStages.Design(stage, new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3),
            new AnalysisSettings(StartHz: 10, StopHz: 1e7, Load: LoadCorner.Min, ConductionModel: ConductionModelChoice.Continuous));
        var a = DesignAnalyzer.Analyze(design);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        Assert.Equal(SmallSignalModel.VoltageModeContinuous, a.Model);
        Assert.Contains(a.Warnings, w => w.Contains("forces the CCM model", StringComparison.Ordinal));
    }
}
