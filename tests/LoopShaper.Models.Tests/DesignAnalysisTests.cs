using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>The new models through the whole analysis: what the workspace and the command line read.</summary>
public class DesignAnalysisTests
{
    [Fact]
    public void Peak_current_mode_design_reports_Qp_the_current_loop_and_every_corner()
    {
        var design = TestStages.Design(TestStages.PointOfLoad(), TestStages.HalfOffSlope(0.1), TestStages.TypeII(40e3, 3e3, 250e3));
        var a = DesignAnalyzer.Analyze(design);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        Assert.Equal(SmallSignalModel.PeakCurrentModeContinuous, a.Model);
        Assert.NotNull(a.CurrentMode!.Qp);
        Assert.Equal(PeakCurrentModeBuck.Qp(a.CurrentMode.Mc, a.OperatingPoint!.DutyCycle), a.CurrentMode.Qp);
        Assert.NotNull(a.CurrentLoopMargins!.CrossoverHz);
        Assert.NotNull(a.CurrentLoopResponse);
        Assert.Equal(40e3, a.Margins!.CrossoverHz!.Value, 40e3 * 1e-6);
        Assert.Equal(6, a.Corners.Length);
        Assert.All(a.Corners, c => Assert.Equal(SmallSignalModel.PeakCurrentModeContinuous, c.Model));

        // The crossover target fixes the compensator once: the main corner crosses at the target, the others elsewhere.
        var main = a.Corners.Single(c => c.Input == InputCorner.Nominal && c.Load == LoadCorner.Max);
        Assert.Equal(40e3, main.CrossoverHz!.Value, 40e3 * 1e-6);
        Assert.Contains(a.Corners, c => Math.Abs(c.CrossoverHz!.Value - 40e3) > 100);
        Assert.All(a.Corners, c => Assert.NotNull(c.Qp));
        foreach (var quantity in new[] { "Sensed on-time slope", "Sensed off-time slope", "Ramp factor", "Modulator gain", "Sampling gain", "Feedforward gain", "Output feedback gain", "Sampling double-pole quality factor", "Ramp for Qp = 1", "Current-loop crossover" })
        {
            Assert.Contains(a.Derivations, d => d.Quantity == quantity && d.Source.Length > 0);
        }
    }

    [Fact]
    public void The_interactive_analysis_leaves_out_the_corners_only_where_no_warning_uses_them()
    {
        // Voltage mode: the corners feed only reports, so the workspace's per-keystroke analysis skips them; every
        // other result is the full analysis's, number for number (both are this project's own code: a consistency check).
        var vm = TestStages.Design(TestStages.PointOfLoad(), new VoltageModeControl(1.0), TestStages.TypeII(40e3, 3e3, 250e3));
        var full = DesignAnalyzer.Analyze(vm);
        var quick = DesignAnalyzer.AnalyzeInteractive(vm);
        Assert.True(full.IsValid, string.Join("; ", full.Issues));
        Assert.Equal(6, full.Corners.Length);
        Assert.Empty(quick.Corners);
        Assert.Equal(full.Margins!.CrossoverHz, quick.Margins!.CrossoverHz);
        Assert.Equal(full.Margins.PhaseMarginDeg, quick.Margins.PhaseMarginDeg);
        Assert.True(full.LoopResponse!.MagnitudeDb.SequenceEqual(quick.LoopResponse!.MagnitudeDb));
        Assert.True(full.LoopResponse.PhaseDeg.SequenceEqual(quick.LoopResponse.PhaseDeg));
        Assert.True(full.LoadStep!.Value.SequenceEqual(quick.LoadStep!.Value));
        Assert.Equal(full.Warnings.ToArray(), quick.Warnings.ToArray());
        Assert.Equal(full.Criteria.ToArray(), quick.Criteria.ToArray());

        // Peak current mode: the subharmonic and Qp warnings look at the worst corner, so the corners stay.
        var pcm = TestStages.Design(TestStages.PointOfLoad(), TestStages.HalfOffSlope(0.1), TestStages.TypeII(40e3, 3e3, 250e3));
        var pcmCorners = DesignAnalyzer.AnalyzeInteractive(pcm).Corners;
        Assert.Equal(6, pcmCorners.Length);
        Assert.Equal(DesignAnalyzer.Analyze(pcm).Corners.ToArray(), pcmCorners.ToArray());
    }

    [Fact]
    public void Subharmonic_oscillation_and_high_Qp_are_warned_with_the_ramp_for_unit_Qp()
    {
        // 5 V to 3.3 V (D about 0.67) without a ramp: mc D' - 0.5 < 0.
        var stage = TestStages.PointOfLoad() with { InputVoltage = new VoltageRange(4.5, 5.0, 5.5), MaxDutyCycle = 0.95 };
        var bare = TestStages.Design(stage, new PeakCurrentModeControl(0.1, CompensationRamp.None), TestStages.TypeII(30e3, 3e3, 250e3));
        var a = DesignAnalyzer.Analyze(bare);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        Assert.True(a.CurrentMode!.IsSubharmonicallyUnstable);
        Assert.Contains(a.Warnings, w => w.StartsWith("SUBHARMONIC OSCILLATION", StringComparison.Ordinal) && w.Contains("gives Qp = 1", StringComparison.Ordinal));

        // A small ramp: stable, but Qp above 2.
        var weak = bare with { Plant = ((BuckPlant)bare.Plant) with { Control = new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.Mc, 1.7)) } };
        var b = DesignAnalyzer.Analyze(weak);
        Assert.True(b.CurrentMode!.Qp > DesignAnalyzer.MaxQp);
        Assert.Contains(b.Warnings, w => w.StartsWith("High Qp", StringComparison.Ordinal));

        // The suggested ramp cures it.
        var cured = bare with { Plant = ((BuckPlant)bare.Plant) with { Control = new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.VoltsPerSecond, a.CurrentMode.SuggestedRampForUnityQpVPerS)) } };
        var c = DesignAnalyzer.Analyze(cured);
        Assert.Equal(1.0, c.CurrentMode!.Qp!.Value, 1e-6);
        Assert.DoesNotContain(c.Warnings, w => w.StartsWith("SUBHARMONIC", StringComparison.Ordinal) || w.StartsWith("High Qp at D", StringComparison.Ordinal));
    }

    [Fact]
    public void Transconductance_loop_carries_the_divider_and_the_ideal_amplifier_beside_it()
    {
        var stage = TestStages.PointOfLoad();
        var ota = new TransconductanceNetwork(CompensatorType.TypeII, new Transconductance(200e-6, 2e6), 10e-9, 20e3, 47e-12);
        var design = TestStages.Design(stage, TestStages.HalfOffSlope(0.1), ota);
        var a = DesignAnalyzer.Analyze(design);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        double hdiv = ((BuckPlant)design.Plant).Feedback.Ratio;
        Assert.Equal(hdiv, a.Loop!.SenseGain);
        Assert.Equal(a.Loop.Compensator.Multiply(a.Loop.Modulator).Multiply(a.Loop.ControlToOutput).Scale(hdiv).MagnitudeDb(1e3), a.Loop.LoopGain.MagnitudeDb(1e3), 9);
        Assert.NotNull(a.IdealAmplifierCompensatorResponse);
        Assert.NotNull(a.IdealAmplifierLoopResponse);
        Assert.NotNull(a.IdealAmplifierMargins);
        // Finite Ro removes the integrator: the loop gain is finite at DC (gm Ro Hdiv Gvc(0)).
        Assert.Equal(0, a.Loop.LoopGain.OriginOrder);
        Assert.Equal(-1, a.ResolvedPlacement!.TransferFunction().OriginOrder);
    }

    [Fact]
    public void Op_amp_network_takes_the_divider_bottom_resistor_from_the_plant_when_not_given()
    {
        var stage = TestStages.PointOfLoad();
        var net = new OpAmpNetwork(CompensatorType.TypeIII, 10e3, 4.7e-9, 20e3, 100e-12, 330, 2.2e-9, Amplifier: new OpAmp(1e4, 5e6));
        var design = TestStages.Design(stage, new VoltageModeControl(1.0), net);
        var built = DesignAnalyzer.BuildLoop(design);
        var withBottom = net with { RBottomOhm = ((BuckPlant)design.Plant).Feedback.BottomOhm };
        Assert.Equal(withBottom.TransferFunction().MagnitudeDb(10), built.Loop.Compensator.MagnitudeDb(10), 12);
        Assert.NotEqual(net.TransferFunction().MagnitudeDb(10), built.Loop.Compensator.MagnitudeDb(10), 3);
        Assert.NotNull(built.IdealAmplifierCompensator);
    }

    [Fact]
    public void Finite_gain_op_amp_approaches_the_ideal_network()
    {
        // Gc = (Zf/Zin) / (1 + (1 + Zf (1/Zin + 1/Rb)) / A): with A0 = 1e9 and GBW = 1e15 Hz the correction is below 1e-5
        // relative over 10 Hz to 10 MHz for this network, so the real and the ideal network agree to 1e-4 dB and 1e-3 deg.
        var net = new OpAmpNetwork(CompensatorType.TypeIII, 10e3, 4.7e-9, 20e3, 100e-12, 330, 2.2e-9, RBottomOhm: 2.2e3, Amplifier: new OpAmp(1e9, 1e15));
        foreach (double f in new FrequencyGrid(10, 1e7, 61).LogSpaced())
        {
            Assert.Equal(net.IdealTransferFunction().MagnitudeDb(f), net.TransferFunction().MagnitudeDb(f), 1e-4);
            Assert.Equal(net.IdealTransferFunction().PhaseDeg(f), net.TransferFunction().PhaseDeg(f), 1e-3);
        }
    }

    [Fact]
    public void Modulator_delay_as_a_fraction_of_the_period()
    {
        var stage = TestStages.PointOfLoad();
        var vm = TestStages.Design(stage, new VoltageModeControl(1.0, ModulatorDelayS: 50e-9, ModulatorDelayFractionOfPeriod: 0.25), TestStages.TypeII(40e3, 3e3, 250e3));
        Assert.Equal(50e-9 + (0.25 / 500e3), DesignAnalyzer.BuildLoop(vm).Loop.LoopGain.DelayS, 1e-18);
        var pcm = TestStages.Design(stage, new PeakCurrentModeControl(0.1, CompensationRamp.None, ModulatorDelayFractionOfPeriod: 0.1), TestStages.TypeII(40e3, 3e3, 250e3));
        var built = DesignAnalyzer.BuildLoop(pcm);
        Assert.Equal(0.1 / 500e3, built.Loop.LoopGain.DelayS, 1e-18);
        Assert.False(built.CurrentLoopGain!.HasDelay);
    }
}
