using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Synthesis.Tests;

/// <summary>Suggested placements: K factor and resonance placement, with their warnings.</summary>
public class PlacementTests
{
    private const double Fs = 600e3;

    [Theory]
    // Buck of TestPlants: the plant is near -136 deg at 60 kHz, so 45 deg needs about 91 deg of boost (Type III), 35 deg about 81 (Type II).
    [InlineData(null, CompensatorType.TypeIII, 60e3, 45.0)]
    [InlineData(CompensatorType.TypeII, CompensatorType.TypeII, 60e3, 35.0)]
    [InlineData(CompensatorType.TypeIII, CompensatorType.TypeIII, 40e3, 60.0)]
    [InlineData(null, CompensatorType.TypeIII, 30e3, 50.0)]
    public void K_factor_placement_puts_crossover_and_phase_margin_on_target_for_the_buck(CompensatorType? asked, CompensatorType expected, double fc, double pm)
    {
        var plant = TestPlants.BuckPlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, fc, pm, asked, Fs));
        Assert.Equal(expected, s.Placement.Type);
        Assert.Empty(s.Warnings);
        Assert.Equal(pm, s.ExpectedPhaseMarginDeg, 1e-9);

        // A full margin analysis of the loop (independent of the placement's own bookkeeping).
        var m = MarginAnalyzer.Analyze(s.Placement.TransferFunction().Multiply(plant), 10, 10e6);
        Assert.Single(m.GainCrossovers);
        Assert.Equal(fc, m.CrossoverHz!.Value, fc * 1e-6);
        Assert.Equal(pm, m.PhaseMarginDeg!.Value, 0.1);
        Assert.True(m.IsClosedLoopStable);
    }

    [Fact]
    public void K_factor_picks_type_I_when_no_boost_is_needed()
    {
        // Current-mode stand-in at 200 Hz: the load pole at 1.5 kHz gives -7.6 deg, so 45 deg needs -37 deg of boost:
        // Type I (Venable 1983), PM = 90 + plant phase.
        var plant = TestPlants.CurrentModePlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, 200, 45, null, Fs));
        Assert.Equal(CompensatorType.TypeI, s.Placement.Type);
        Assert.Null(s.K);
        double plantDeg = plant.PhaseDeg(200);
        Assert.Equal(90 + plantDeg, s.ExpectedPhaseMarginDeg, 1e-9);
        var m = MarginAnalyzer.Analyze(s.Placement.TransferFunction().Multiply(plant), 1, 1e6);
        Assert.Equal(200, m.CrossoverHz!.Value, 200 * 1e-6);
        Assert.Equal(90 + plantDeg, m.PhaseMarginDeg!.Value, 0.1);
    }

    [Fact]
    public void K_factor_type_II_for_the_current_mode_plant_meets_its_target()
    {
        var plant = TestPlants.CurrentModePlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, 30e3, 60, null, Fs));
        Assert.Equal(CompensatorType.TypeII, s.Placement.Type);
        Assert.Equal(KFactor.TypeII(s.RequiredBoostDeg), s.K!.Value, 1e-12);
        Assert.Equal(30e3 / s.K.Value, s.Placement.Zero1Hz!.Value, 1e-6);
        var m = MarginAnalyzer.Analyze(s.Placement.TransferFunction().Multiply(plant), 10, 10e6);
        Assert.Equal(30e3, m.CrossoverHz!.Value, 30e3 * 1e-6);
        Assert.Equal(60, m.PhaseMarginDeg!.Value, 0.1);
        Assert.Contains(s.Derivations, d => d.Quantity == "K factor (Type II)" && d.Source.Contains("Venable 1983", StringComparison.Ordinal));
    }

    [Fact]
    public void Boost_beyond_type_II_is_warned_and_clamped_below_90_degrees()
    {
        // 70 deg over the buck at 60 kHz needs about 110 deg: more than a Type II can give.
        var s = PlacementAdvisor.Suggest(TestPlants.BuckPlant(), new PlacementRequest(PlacementMethod.KFactor, 60e3, 70, CompensatorType.TypeII, Fs));
        Assert.True(s.RequiredBoostDeg > 90);
        Assert.Contains(s.Warnings, w => w.Contains("not reachable with Type II", StringComparison.Ordinal));
        Assert.Equal(KFactor.TypeII(89.0), s.K!.Value, 1e-9);
        Assert.True(s.ExpectedPhaseMarginDeg < 70);
    }

    [Fact]
    public void Boost_beyond_type_III_is_warned()
    {
        // A plant with a triple pole far below the crossover sits near -270 deg: 45 deg needs about 225 deg of boost.
        var plant = TransferFunction.FromFactors(1e3, 0, [], [Factor.Real(100), Factor.Real(100), Factor.Real(100)]);
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, 20e3, 45, null, Fs));
        Assert.Equal(CompensatorType.TypeIII, s.Placement.Type);
        Assert.Contains(s.Warnings, w => w.Contains("not reachable with Type III", StringComparison.Ordinal));
    }

    [Fact]
    public void Crossover_above_a_fifth_of_the_switching_frequency_is_warned()
    {
        var s = PlacementAdvisor.Suggest(TestPlants.BuckPlant(), new PlacementRequest(PlacementMethod.KFactor, 150e3, 45, null, Fs));
        Assert.Contains(s.Warnings, w => w.Contains("above a fifth of the switching frequency", StringComparison.Ordinal));
    }

    [Fact]
    public void Voltage_mode_resonance_puts_the_double_zero_at_the_LC_resonance_and_the_poles_at_the_ESR_zero_and_fs_over_2()
    {
        var plant = TestPlants.BuckPlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.VoltageModeResonance, 60e3, 45, null, Fs));
        var p = s.Placement;
        Assert.Equal(CompensatorType.TypeIII, p.Type);

        // The resonance: the complex pole pair of Gvd; |p| / 2 pi lies within 2 % of 1 / (2 pi sqrt(L C)) (Erickson &
        // Maksimovic, 2nd ed., sec. 8.2.1; the losses and ESRs move it a little).
        var pair = plant.Poles.Where(r => r.Imaginary > 0).MinBy(r => r.Magnitude);
        Assert.Equal(pair.Magnitude / (2 * Math.PI), p.Zero1Hz!.Value, 1e-9);
        Assert.Equal(p.Zero1Hz.Value, p.Zero2Hz!.Value);
        double f0 = 1 / (2 * Math.PI * Math.Sqrt(1e-6 * ((3 * 22e-6) + 220e-6)));
        Assert.Equal(f0, p.Zero1Hz.Value, f0 * 0.02);

        // The polymer branch's zero: lower root of 1 + s ESR C + s^2 ESL C (quadratic formula), 48 kHz.
        double esr = 15e-3, c = 220e-6, esl = 1.5e-9;
        double sLow = (esr * c - Math.Sqrt((esr * c * esr * c) - (4 * esl * c))) / (2 * esl * c);
        Assert.Equal(sLow / (2 * Math.PI), p.Pole1Hz!.Value, p.Pole1Hz.Value * 1e-6);
        Assert.Equal(Fs / 2, p.Pole2Hz!.Value);

        // The gain still sets the crossover.
        var m = MarginAnalyzer.Analyze(p.TransferFunction().Multiply(plant), 10, 10e6);
        Assert.Equal(60e3, m.CrossoverHz!.Value, 60e3 * 1e-6);
        Assert.Equal(s.ExpectedPhaseMarginDeg, m.PhaseMarginDeg!.Value, 0.1);
    }

    [Fact]
    public void Current_mode_resonance_puts_the_zero_at_the_load_pole_and_the_pole_at_the_ESR_zero()
    {
        var s = PlacementAdvisor.Suggest(TestPlants.CurrentModePlant(), new PlacementRequest(PlacementMethod.CurrentModeResonance, 30e3, 45, null, Fs));
        Assert.Equal(CompensatorType.TypeII, s.Placement.Type);
        Assert.Equal(1.5e3, s.Placement.Zero1Hz!.Value, 1e-6);
        Assert.Equal(30e3, s.Placement.Pole1Hz!.Value, 1e-6);
    }

    [Fact]
    public void Current_mode_resonance_without_an_ESR_zero_puts_the_pole_at_fs_over_2()
    {
        var plant = TransferFunction.FromFactors(8.0, 0, [], [Factor.Real(1.5e3), Factor.Pair(300e3, 0.64)]);
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.CurrentModeResonance, 30e3, 45, null, Fs));
        Assert.Equal(Fs / 2, s.Placement.Pole1Hz!.Value);
        Assert.Contains(s.Warnings, w => w.Contains("no ESR zero", StringComparison.Ordinal));
    }

    [Fact]
    public void Defaults_come_from_the_design_criteria_and_fs_over_10()
    {
        var design = TestPlants.Buck(TestPlants.AnyPlacement);
        var r = PlacementAdvisor.RequestFor(design, PlacementMethod.KFactor);
        Assert.Equal(60e3, r.CrossoverHz);
        Assert.Equal(design.Criteria.MinPhaseMarginDeg, r.PhaseMarginDeg);
        var s = PlacementAdvisor.Suggest(design, r);
        Assert.Equal(45.0, s.ExpectedPhaseMarginDeg, 1e-9);
    }

    [Fact]
    public void Bad_requests_name_the_field()
    {
        var plant = TestPlants.BuckPlant();
        Assert.False(PlacementAdvisor.TrySuggest(plant, new PlacementRequest(PlacementMethod.KFactor, -5, 45), out _, out var issues));
        Assert.Contains(issues, i => i.Field == "synthesis.crossoverHz");
        Assert.False(PlacementAdvisor.TrySuggest(plant, new PlacementRequest(PlacementMethod.VoltageModeResonance, 50e3, 45), out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.switchingFrequencyHz");
        Assert.False(PlacementAdvisor.TrySuggest(plant, new PlacementRequest(PlacementMethod.KFactor, 50e3, double.NaN), out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.phaseMarginDeg");
        var noPoles = TransferFunction.FromRoots(2.0, 0, [], [new Complex(-1e3, 0)]);
        Assert.False(PlacementAdvisor.TrySuggest(noPoles, new PlacementRequest(PlacementMethod.VoltageModeResonance, 5e3, 45, null, Fs), out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.method" && i.Message.Contains("resonance", StringComparison.Ordinal));
    }
}
