using System.Numerics;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>
/// Peak current mode against R. B. Ridley, "A New, Continuous-Time Model for Current-Mode Control", IEEE Trans. Power
/// Electronics 6(2), 1991, and against current-programmed control in R. W. Erickson, D. Maksimovic, Fundamentals of
/// Power Electronics, 2nd ed., ch. 12.
/// </summary>
public class RidleyCurrentModeTests
{
    private const double Fs = 500e3;

    /// <summary>A lossless 5 V output at duty cycle D (Vin = 5 / D), 10 uH, 100 uF, 1 A.</summary>
    private static BuckPowerStage StageAt(double d, double loadA = 1.0, double l = 10e-6, double c = 100e-6) => TestStages.Lossless(5.0 / d, 5.0, loadA, l, c, Fs);

    private static BuckTransferFunctions Pcm(BuckPowerStage stage, PeakCurrentModeControl control)
    {
        var op = BuckOperatingPoint.Solve(stage, new OperatingCondition(stage.InputVoltage.NominalV, stage.LoadCurrent.MaxA));
        return PeakCurrentModeBuck.TransferFunctions(stage, op, control);
    }

    private static PeakCurrentModeControl Mc(double mc, double ri = 0.2) => new(ri, new CompensationRamp(CompensationRampKind.Mc, mc));

    // Qp = 1 / (pi (mc D' - 0.5)) (Ridley 1991); the expected values are that formula worked by hand.
    [Theory]
    [InlineData(0.30, 1.0, 1.5915494)]   // 1 / (pi 0.2)
    [InlineData(0.20, 1.0, 1.0610330)]   // 1 / (pi 0.3)
    [InlineData(0.50, 1.5, 1.2732395)]   // 1 / (pi 0.25)
    [InlineData(0.60, 2.0, 1.0610330)]   // 1 / (pi 0.3)
    [InlineData(0.70, 3.0, 0.7957747)]   // 1 / (pi 0.4)
    [InlineData(0.45, 1.2, 1.9894368)]   // 1 / (pi 0.16)
    public void Qp_follows_Ridleys_formula(double d, double mc, double expected)
    {
        Assert.Equal(expected, PeakCurrentModeBuck.Qp(mc, d)!.Value, 6);

        // The same Qp comes out of the model for a stage at that duty cycle with the ramp given as mc.
        var f = Pcm(StageAt(d), Mc(mc)).CurrentMode!;
        Assert.Equal(d, f.DutyCycle, 12);
        Assert.Equal(mc, f.Mc, 12);
        Assert.Equal(expected, f.Qp!.Value, 6);
    }

    [Theory]
    [InlineData(0.30, 1.0)]
    [InlineData(0.50, 1.5)]
    [InlineData(0.60, 2.0)]
    [InlineData(0.70, 3.0)]
    public void Closed_current_loop_double_pole_at_half_the_switching_frequency_has_Ridleys_Qp(double d, double mc)
    {
        // Ridley's Qp comes from Ti with Gid approximated by Vin / (s L) near fs/2; the exact model keeps the output
        // capacitor, the load and the kr path. With f0 = 5 kHz, 50 times below fs/2, those shift the pair by well under
        // 2 % (the L C term is (f0 / fn)^2 = 4e-4 of the inductor's impedance; kr adds Ts Ri / (2L) relative to Fm Vin, and
        // R = 5 Ohm damps by sqrt(L/C)/R): 2 % on Q and 1 % on the frequency.
        var tfs = Pcm(StageAt(d), Mc(mc));
        var pair = TestStages.PolesBetween(tfs.ControlToOutput, 0.3 * Fs, 0.9 * Fs).Where(p => p.Imaginary > 0).ToList();
        Assert.Single(pair);
        double qp = PeakCurrentModeBuck.Qp(mc, d)!.Value;
        Assert.InRange(TestStages.QualityOf(pair[0]) / qp, 0.98, 1.02);
        Assert.InRange(pair[0].Magnitude / (Math.PI * Fs), 0.99, 1.01);
    }

    [Fact]
    public void Subharmonic_boundary_is_at_half_duty_cycle_without_ramp()
    {
        // Textbook fact (Erickson & Maksimovic, 2nd ed., sec. 12.1; Ridley 1991): without a ramp the current loop is
        // stable for D < 0.5 and oscillates at fs/2 for D > 0.5; Ridley's Qp is infinite at D = 0.5, mc = 1.
        Assert.Null(PeakCurrentModeBuck.Qp(1.0, 0.5));
        Assert.True(PeakCurrentModeBuck.Qp(1.0, 0.499) > 100);
        Assert.Null(PeakCurrentModeBuck.Qp(1.0, 0.501));

        // The exact model: the double pole near fs/2 is in the left half plane below D = 0.5 and in the right half plane above.
        foreach (var (d, stable) in new[] { (0.45, true), (0.48, true), (0.52, false), (0.55, false) })
        {
            var tfs = Pcm(StageAt(d), Mc(1.0));
            var pair = TestStages.PolesBetween(tfs.ControlToOutput, 0.3 * Fs, 0.9 * Fs).ToList();
            Assert.Equal(2, pair.Count);
            Assert.True(pair.All(p => p.Real < 0) == stable, $"D = {d}: poles {string.Join(", ", pair)}");
            Assert.Equal(!stable, tfs.CurrentMode!.IsSubharmonicallyUnstable);
        }
    }

    [Theory]
    [InlineData(0.55)]
    [InlineData(0.60)]
    [InlineData(0.70)]
    [InlineData(0.85)]
    public void Qp_boundary_is_the_sampled_data_stability_boundary(double d)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 12.1: a perturbation of the sampled current changes by
        // alpha = -(Sf - Se) / (Sn + Se) each period, stable for |alpha| < 1, i.e. Se > (Sf - Sn) / 2. Ridley's
        // mc D' - 0.5 = 0 must fall exactly there.
        var stage = StageAt(d);
        var probe = Pcm(stage, Mc(1.0)).CurrentMode!;
        double seCritical = (probe.OffSlopeVPerS - probe.OnSlopeVPerS) / 2;
        var at = Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.VoltsPerSecond, seCritical))).CurrentMode!;
        Assert.Equal(0.0, at.DampingTerm, 12);
        Assert.False(Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.VoltsPerSecond, 1.01 * seCritical))).CurrentMode!.IsSubharmonicallyUnstable);
        Assert.True(Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.VoltsPerSecond, 0.99 * seCritical))).CurrentMode!.IsSubharmonicallyUnstable);
    }

    [Theory]
    [InlineData(0.2)]
    [InlineData(0.5)]
    [InlineData(0.8)]
    [InlineData(0.9)]
    public void Half_the_off_slope_as_ramp_keeps_every_duty_cycle_stable(double d)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 12.1: with Ma = M2 / 2 the current loop is stable for all D
        // (here mc D' - 0.5 = 0.5 - D/2 > 0).
        var f = Pcm(StageAt(d), TestStages.HalfOffSlope(0.2)).CurrentMode!;
        Assert.Equal(0.5 - (d / 2), f.DampingTerm, 12);
        Assert.False(f.IsSubharmonicallyUnstable);
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.6)]
    public void Suggested_ramp_gives_unit_Qp(double d)
    {
        // mc = (1/pi + 0.5) / D' puts Qp at 1 (Ridley's formula solved for mc; Qp near 1 is common practice, no source).
        var stage = StageAt(d);
        var first = Pcm(stage, Mc(1.0)).CurrentMode!;
        var tuned = Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.VoltsPerSecond, first.SuggestedRampForUnityQpVPerS))).CurrentMode!;
        Assert.Equal(1.0, tuned.Qp!.Value, 9);
        Assert.Equal(first.SuggestedMcForUnityQp, tuned.Mc, 9);
    }

    [Fact]
    public void Dc_gain_is_Ridleys_closed_form_when_lossless()
    {
        // Ridley 1991: Gvc(0) = (R / Ri) / (1 + R Ts (mc D' - 0.5) / L) for the lossless buck.
        foreach (var (d, mc, load) in new[] { (0.3, 1.0, 1.0), (0.6, 1.8, 2.0), (0.42, 1.3, 0.6) })
        {
            var stage = StageAt(d, load);
            var tfs = Pcm(stage, Mc(mc));
            double r = 5.0 / load, ts = 1 / Fs, l = stage.Inductor.InductanceH;
            double expected = r / 0.2 / (1 + (r * ts * ((mc * (1 - d)) - 0.5) / l));
            Assert.Equal(expected, tfs.ControlToOutput.DcGain!.Value, 9 * expected * 1e-9);
        }
    }

    [Theory]
    [InlineData(200e-6, 0.02)]
    [InlineData(800e-6, 0.005)]
    public void Low_frequency_gain_and_load_pole_approach_the_simple_current_mode_model(double inductanceH, double deviationBound)
    {
        // Erickson & Maksimovic, 2nd ed., sec. 12.2 (simple approximation, ideal current programming): the buck's
        // control-to-output is Gvc = (R / Ri) / (1 + s R C). Ridley's model differs from it by the term
        // x = R Ts (mc D' - 0.5) / L in both the DC gain and the load pole (Ridley 1991); it vanishes as L grows, so the
        // exact model must approach the simple one with a deviation bounded by x (0.02 for 200 uH, 0.005 for 800 uH here).
        double d = 0.4, mc = 1.5, load = 1.0, c = 100e-6;
        var stage = StageAt(d, load, inductanceH, c);
        var tfs = Pcm(stage, Mc(mc));
        double r = 5.0 / load;
        double x = r * (1 / Fs) * ((mc * (1 - d)) - 0.5) / inductanceH;
        Assert.True(x <= deviationBound, $"x = {x}");

        double gain = tfs.ControlToOutput.DcGain!.Value;
        Assert.InRange(gain / (r / 0.2), 1 - (1.0001 * x), 1.0);

        var pole = tfs.ControlToOutput.Poles.Where(p => p.Imaginary == 0).MinBy(p => p.Magnitude);
        double wSimple = 1 / (r * c);
        Assert.InRange(pole.Magnitude / wSimple, 1.0, 1 + (1.05 * x));
    }

    [Fact]
    public void Load_pole_matches_Ridleys_closed_form()
    {
        // Ridley 1991: wp = 1 / (C R) + Ts (mc D' - 0.5) / (L C), an approximation that neglects the coupling with the
        // double pole at fs/2; with fs/2 a hundred times above wp the coupling is under 1 %.
        double d = 0.35, mc = 1.4, load = 2.0, l = 10e-6, c = 100e-6;
        var tfs = Pcm(StageAt(d, load, l, c), Mc(mc));
        double r = 5.0 / load, ts = 1 / Fs;
        double wp = (1 / (c * r)) + (ts * ((mc * (1 - d)) - 0.5) / (l * c));
        var pole = tfs.ControlToOutput.Poles.Where(p => p.Imaginary == 0).MinBy(p => p.Magnitude);
        Assert.InRange(pole.Magnitude / wp, 0.99, 1.01);
    }

    [Fact]
    public void Line_to_output_vanishes_with_a_ramp_of_half_the_off_slope()
    {
        // Ridley 1991 (from memory) and Erickson & Maksimovic, 2nd ed., sec. 12.3 (from memory): for the buck, Se = Sf / 2
        // nulls the line-to-output gain at low frequency. In this model the DC value is D + Fm Vin kf (lossless).
        var stage = StageAt(0.4);
        Assert.Equal(0.0, Pcm(stage, TestStages.HalfOffSlope(0.2)).LineToOutput.DcGain!.Value, 12);
        double below = Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.3))).LineToOutput.DcGain!.Value;
        double above = Pcm(stage, new PeakCurrentModeControl(0.2, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.7))).LineToOutput.DcGain!.Value;
        Assert.True(below < 0 && above > 0, $"{below}, {above}");
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(120e-9)]
    public void Model_equals_the_loop_closed_point_by_point(double delayS)
    {
        // Cross-method: the model's polynomial algebra against the loop d = Fm (vc - Ri He iL + kf vg + kr v) closed by
        // complex arithmetic at each frequency around the voltage-mode Gvd, Gvg, Zout and a Gid evaluated directly from
        // the capacitor branches (Gid = Veff Y / (1 + Zs Y), Gig = D Y / (1 + Zs Y), Gii = 1 / (1 + Zs Y)). A modulator
        // delay multiplies vout / vc by the exact e^(-s Td) and leaves the current loop alone.
        var stage = TestStages.PointOfLoad();
        var at = new OperatingCondition(12.0, 3.0);
        var op = BuckOperatingPoint.Solve(stage, at);
        var control = new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.VoltsPerSecond, 0.2e6), delayS);
        var pcm = PeakCurrentModeBuck.TransferFunctions(stage, op, control);
        var vmode = VoltageModeBuck.TransferFunctions(stage, op);
        var f = pcm.CurrentMode!;
        Assert.Equal(delayS, pcm.ControlToOutput.DelayS);

        double ts = 1 / stage.SwitchingFrequencyHz, wn = Math.PI / ts, l = stage.Inductor.InductanceH;
        foreach (double hz in new[] { 10.0, 300.0, 3e3, 20e3, 80e3, 200e3, 249e3, 400e3, 2e6 })
        {
            var s = new Complex(0, 2 * Math.PI * hz);
            var y = TestStages.Admittance(stage, op.LoadResistanceOhm, s);
            var zs = op.SeriesResistanceOhm + (s * l);
            var gid = op.EffectiveInputVoltageV * y / (1 + (zs * y));
            var gig = op.DutyCycle * y / (1 + (zs * y));
            var gii = 1 / (1 + (zs * y));
            var gvd = vmode.ControlToOutput.EvaluateHz(hz);
            var gvg = vmode.LineToOutput.EvaluateHz(hz);
            var zo = vmode.OutputImpedance.EvaluateHz(hz);
            var he = 1 + (s / (wn * (-2 / Math.PI))) + (s * s / (wn * wn));
            var fm = new Complex(f.ModulatorGainPerV, 0);
            var delta = 1 + (fm * ((f.SenseGainOhm * he * gid) - (f.OutputFeedbackGainKr * gvd)));
            var gvc = fm * gvd / delta * Complex.Exp(-s * delayS);
            var line = gvg + (gvd * fm * (f.FeedforwardGainKf + (f.OutputFeedbackGainKr * gvg) - (f.SenseGainOhm * he * gig)) / delta);
            var zout = zo + (gvd * fm * ((f.SenseGainOhm * he * gii) + (f.OutputFeedbackGainKr * zo)) / delta);
            var ti = f.ModulatorGainPerV * f.SenseGainOhm * he * gid;

            AssertSame(gvc, pcm.ControlToOutput.EvaluateHz(hz), $"Gvc at {hz} Hz");
            AssertSame(line, pcm.LineToOutput.EvaluateHz(hz), $"Gvg at {hz} Hz");
            AssertSame(zout, pcm.OutputImpedance.EvaluateHz(hz), $"Zout at {hz} Hz");
            AssertSame(ti, pcm.CurrentLoopGain!.EvaluateHz(hz), $"Ti at {hz} Hz");
        }
    }

    private static void AssertSame(Complex expected, Complex actual, string what)
        => Assert.True(Complex.Abs(expected - actual) <= 1e-8 * Complex.Abs(expected), $"{what}: direct {expected}, model {actual}");
}
