using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Loop;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Models.Tests;

/// <summary>Closed-loop output impedance, the load step of a known second-order case and the integrating loop's DC impedance.</summary>
public class ClosedLoopTests
{
    [Fact]
    public void Closed_loop_output_impedance_is_the_open_loop_one_over_one_plus_t_at_every_frequency()
    {
        var design = CornerTests.VoltageModeRail();
        var loop = LoopShaper.Core.Design.DesignAnalyzer.BuildLoop(design).Loop;
        var perf = ClosedLoopAnalyzer.Analyze(design);
        var f = perf.OutputImpedanceClosed!.FrequencyHz;
        for (int k = 0; k < f.Length; k += 7)
        {
            // Erickson & Maksimovic, 2nd ed., sec. 9.2: Zout,cl = Zout / (1 + T), evaluated directly here.
            Complex expected = loop.OutputImpedance!.EvaluateHz(f[k]) / (1 + loop.LoopGain.EvaluateHz(f[k]));
            Assert.Equal(20 * Math.Log10(expected.Magnitude), perf.OutputImpedanceClosed.MagnitudeDb[k], 6);
            double dp = perf.OutputImpedanceClosed.PhaseDeg[k] - (expected.Phase * 180 / Math.PI);
            Assert.Equal(0.0, dp - (360 * Math.Round(dp / 360)), 6);
        }
    }

    [Fact]
    public void Load_step_of_a_second_order_closed_loop_matches_its_closed_form()
    {
        // Zout = 1 / (s C) (an ideal current-source stage into C) and T = wn^2 (1 + 2 zeta s / wn) / s^2 give
        // Zout,cl = Zout / (1 + T) = s / (C (s^2 + 2 zeta wn s + wn^2)). A load step I then gives the impulse response of
        // the standard second-order system scaled by -I / C: v(t) = -(I / (C wd)) e^(-zeta wn t) sin(wd t), wd = wn sqrt(1 - zeta^2)
        // (Ogata, Modern Control Engineering, 5th ed., sec. 5-3, impulse response of the second-order system), with the peak
        // at tan(wd tp) = wd / (zeta wn) and |v(tp)| = (I / (C wn)) e^(-zeta wn tp).
        const double c = 100e-6, wn = 2 * Math.PI * 10e3, zeta = 0.3, i = 2.0;
        var zout = TransferFunction.FromRoots(1.0 / c, -1, [], []);
        var t = TransferFunction.FromCoefficients([2 * zeta * wn, wn * wn], [1.0, 0.0, 0.0]);
        var loop = new LoopModel(t, TransferFunction.Constant(1.0), TransferFunction.Constant(1.0), 1.0, 1.0, null, zout);
        double wd = wn * Math.Sqrt(1 - (zeta * zeta));
        double tp = Math.Atan2(wd, zeta * wn) / wd;
        var perf = ClosedLoopAnalyzer.Analyze(loop, [.. new FrequencyGrid(10, 1e6, 200).LogSpaced()], new TransientSettings(LoadStepA: i, LoadSlewAPerS: 0, RecoveryBandV: 0.01 * i / (c * wn), DurationS: 2e-3, Samples: 20001));
        var step = perf.LoadStep!;
        Assert.Equal(-(i / (c * wn)) * Math.Exp(-zeta * wn * tp), step.PeakDeviationV, 1e-4 * i / (c * wn));
        Assert.Equal(tp, step.PeakTimeS, 1e-7);
        for (int k = 0; k < step.Response.TimeS.Length; k += 997)
        {
            double tk = step.Response.TimeS[k];
            double v = -(i / (c * wd)) * Math.Exp(-zeta * wn * tk) * Math.Sin(wd * tk);
            Assert.Equal(v, step.Response.Value[k], 1e-9 * i / (c * wn) + 1e-6 * Math.Abs(v));
        }

        // Recovery into +-1 % of the peak scale: the envelope (I / (C wd)) e^(-zeta wn t) bounds it from above.
        double envelope = Math.Log(i / (c * wd) / step.RecoveryBand) / (zeta * wn);
        Assert.InRange(step.RecoveryTimeS!.Value, 0.5 * envelope, envelope);
    }

    [Fact]
    public void Dc_output_impedance_of_an_integrating_loop_tends_to_zero()
    {
        var design = CornerTests.VoltageModeRail();
        var loop = LoopShaper.Core.Design.DesignAnalyzer.BuildLoop(design).Loop;
        var zcl = loop.ClosedOutputImpedance(null)!;
        // An integrator in T makes Zout / (1 + T) ~ s Zout(0) / wi at low frequency: it falls 20 dB per decade to zero.
        double z1 = zcl.EvaluateHz(1e-2).Magnitude, z2 = zcl.EvaluateHz(1e-3).Magnitude;
        Assert.Equal(10.0, z1 / z2, 1e-3);
        Assert.True(z2 < 1e-6 * loop.OutputImpedance!.EvaluateHz(1e-3).Magnitude);
        Assert.Equal(0.0, zcl.DcGain);
        var perf = ClosedLoopAnalyzer.Analyze(design);
        Assert.Equal(0.0, perf.LoadStep!.FinalValueV!.Value, 12);
        Assert.NotNull(perf.LoadStep.RecoveryTimeS);
    }
}
