using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>Component synthesis: ideal parts on target, snapping, re-analysis, neighbour search, warnings and tolerances.</summary>
public class SynthesisTests
{
    private const double Fs = 600e3;

    private static PlacementSuggestion Suggest(double fc, double pm, CompensatorType? type = null)
        => PlacementAdvisor.Suggest(TestPlants.BuckPlant(), new PlacementRequest(PlacementMethod.KFactor, fc, pm, type, Fs));

    [Theory]
    [InlineData(CompensatorType.TypeIII, 60e3, 45.0)]
    [InlineData(CompensatorType.TypeIII, 40e3, 55.0)]
    [InlineData(CompensatorType.TypeII, 60e3, 35.0)]
    public void Ideal_parts_put_crossover_and_phase_margin_on_target(CompensatorType type, double fc, double pm)
    {
        var plant = TestPlants.BuckPlant();
        var s = Suggest(fc, pm, type);
        var r = NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { StopHz = 10e6 });
        Assert.Equal(type, r.IdealNetwork.Type);

        // An independent margin analysis of the loop built from the ideal parts (OpAmpNetwork's own formulas).
        var m = MarginAnalyzer.Analyze(r.IdealNetwork.TransferFunction().Multiply(plant), 10, 10e6);
        Assert.Equal(fc, m.CrossoverHz!.Value, fc * 1e-6);
        Assert.Equal(pm, m.PhaseMarginDeg!.Value, 0.1);
        Assert.Equal(fc, r.Ideal.CrossoverHz!.Value, fc * 1e-6);
        Assert.Equal(pm, r.Ideal.PhaseMarginDeg!.Value, 0.1);
        Assert.NotNull(r.Ideal.GainMarginDb);
    }

    [Fact]
    public void Snapped_parts_are_preferred_values_and_the_network_uses_them()
    {
        var s = Suggest(60e3, 45);
        var o = new SynthesisOptions { ResistorSeries = ESeries.E96, CapacitorSeries = ESeries.E12, OutputVoltageV = 1.2, ReferenceV = 0.6 };
        var r = NetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), s.Placement, o);
        Assert.Equal(["R1", "R2", "C1", "C2", "R3", "C3", "R4"], r.Parts.Select(p => p.Designator).ToArray());
        foreach (var p in r.Parts)
        {
            var series = p.Kind == PartKind.Resistor ? ESeries.E96 : ESeries.E12;
            Assert.Equal(series, p.Value.Series);
            Assert.True(StandardValues.IsPreferred(p.Value.Value, series), $"{p.Designator} = {p.Value.Value} is not an {series} value");
            Assert.Equal(StandardValues.Snap(p.Value.IdealValue, series).Value, p.Value.Value);
            // Nearest in log distance: never further than half the widest step of the series (E12: 10^(1/12), 21 %; E96: 2.4 %).
            double halfStep = p.Kind == PartKind.Resistor ? 0.025 : 0.11;
            Assert.True(Math.Abs(p.Value.ErrorPct) <= 100 * halfStep, $"{p.Designator}: {p.Value.ErrorPct} %");
        }

        // R1 = 10 kOhm is in E96 and is kept as given; R4 = R1 Vref / (Vout - Vref) = 10 kOhm for 1.2 V from 0.6 V.
        Assert.Equal(10e3, r.IdealNetwork.R1Ohm);
        Assert.Equal(10e3, r.SnappedNetwork.RBottomOhm, 1e-9);
        Assert.Equal(r.Parts.Single(p => p.Designator == "C3").Value.Value, r.SnappedNetwork.C3F);
        Assert.Equal(r.Parts.Single(p => p.Designator == "R2").Value.Value, r.SnappedNetwork.R2Ohm);
        Assert.Equal(r.Parts.Single(p => p.Designator == "C1").Value.IdealValue, r.IdealNetwork.C1F);

        // The snapped loop is analysed beside the ideal one and stays near the target.
        Assert.NotNull(r.Snapped.CrossoverHz);
        Assert.True(Math.Abs(r.Snapped.CrossoverHz!.Value / 60e3 - 1) < 0.3);
        Assert.True(Math.Abs(r.Snapped.PhaseMarginDeg!.Value - 45) < 10);
        Assert.Contains(r.Derivations, d => d.Quantity == "Loop with the snapped parts");
        Assert.Contains(r.Derivations, d => d.Quantity == "R3" && d.Formula.Contains("R1 fz2 / (fp2 - fz2)", StringComparison.Ordinal));
    }

    [Fact]
    public void Neighbour_search_is_never_worse_than_plain_snapping_and_stays_within_its_steps()
    {
        var s = Suggest(60e3, 45);
        var o = new SynthesisOptions { CapacitorSeries = ESeries.E6, ResistorSeries = ESeries.E24, SearchNeighbours = true, SearchSteps = 2 };
        var r = NetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), s.Placement, o);
        Assert.NotNull(r.Search);
        var search = r.Search!;
        Assert.Equal(3125, search.CandidatesTried); // 5 free parts, 5 values each
        Assert.True(search.Distance <= search.SnappedDistance, $"search {search.Distance} vs snapped {search.SnappedDistance}");
        Assert.Equal(60e3, r.TargetCrossoverHz, 60e3 * 1e-6);
        Assert.Equal(45, r.TargetPhaseMarginDeg, 0.1);

        // The reported distance is that of a full margin analysis of the chosen network.
        var m = MarginAnalyzer.Analyze(search.Network.TransferFunction().Multiply(TestPlants.BuckPlant()), 10, 1e6);
        Assert.Equal(m.CrossoverHz, search.Performance.CrossoverHz);
        double a = 100 * Math.Log(m.CrossoverHz!.Value / r.TargetCrossoverHz), b = m.PhaseMarginDeg!.Value - r.TargetPhaseMarginDeg;
        Assert.Equal((a * a) + (b * b), search.Distance, 1e-9);
        foreach (var (p, q) in r.Parts.Zip(search.Parts))
        {
            Assert.Equal(p.Designator, q.Designator);
            Assert.InRange(q.Value.Index - p.Value.Index, -2, 2);
            Assert.True(StandardValues.IsPreferred(q.Value.Value, q.Value.Series));
        }

        Assert.Equal(p0(r, "R1"), p0Search(r, "R1"));
        Assert.Same(search.Network, r.ChosenNetwork);

        static double p0(NetworkSynthesis x, string d) => x.Parts.Single(p => p.Designator == d).Value.Value;
        static double p0Search(NetworkSynthesis x, string d) => x.Search!.Parts.Single(p => p.Designator == d).Value.Value;
    }

    [Fact]
    public void Impractical_values_are_warned()
    {
        var s = Suggest(60e3, 45);
        var plant = TestPlants.BuckPlant();
        var low = NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { R1Ohm = 100 });
        Assert.Contains(low.Warnings, w => w.StartsWith("R1 = 100 Ohm is outside 1 kOhm to 1 MOhm", StringComparison.Ordinal));
        var high = NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { R1Ohm = 2e6 });
        Assert.Contains(high.Warnings, w => w.Contains("below 10 pF", StringComparison.Ordinal));
        Assert.Contains(high.Warnings, w => w.Contains("outside 1 kOhm to 1 MOhm", StringComparison.Ordinal));
        var fine = NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { R1Ohm = 10e3 });
        Assert.DoesNotContain(fine.Warnings, w => w.Contains("1 kOhm to 1 MOhm", StringComparison.Ordinal) || w.Contains("10 pF", StringComparison.Ordinal));
    }

    [Fact]
    public void A_non_preferred_R1_is_snapped_first_and_warned()
    {
        var r = NetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), Suggest(60e3, 45).Placement, new SynthesisOptions { R1Ohm = 12.5e3, ResistorSeries = ESeries.E24 });
        Assert.Equal(13e3, r.IdealNetwork.R1Ohm, 1e-9);
        Assert.Contains(r.Warnings, w => w.Contains("not an E24 value", StringComparison.Ordinal));
        // R1 shows the value asked for as its ideal value: 13k against 12.5k is +4 %.
        Assert.Equal(4.0, r.Parts[0].Value.ErrorPct, 1e-9);
    }

    [Fact]
    public void Tolerances_default_to_1_and_5_percent_and_can_be_set_per_part()
    {
        var s = Suggest(60e3, 45);
        var r = NetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), s.Placement, new SynthesisOptions
        {
            Tolerances = ImmutableDictionary<string, PartTolerance>.Empty.Add("C3", new PartTolerance(10)),
        });
        Assert.All(r.Parts.Where(p => p.Kind == PartKind.Resistor), p => Assert.Equal(1.0, p.Tolerance.TolerancePct));
        Assert.Equal(5.0, r.Tolerances["C1"].TolerancePct);
        Assert.Equal(10.0, r.Tolerances["C3"].TolerancePct);
        Assert.Equal(0.9 * 4.7e-9, new PartTolerance(10).Low(4.7e-9), 1e-21);
    }

    [Fact]
    public void A_design_is_synthesised_from_its_own_placement_divider_and_range()
    {
        var s = Suggest(60e3, 45);
        var design = TestPlants.Buck(s.Placement with { Gain = new GainSetting(GainSettingKind.CrossoverHz, 60e3) });
        var r = NetworkSynthesizer.Synthesize(design, new SynthesisOptions { ResistorSeries = ESeries.E192, CapacitorSeries = ESeries.E24 });
        Assert.Equal(10e3, r.IdealNetwork.R1Ohm);
        Assert.Equal(10e3, r.IdealNetwork.RBottomOhm, 1e-9);
        Assert.Equal(60e3, r.TargetCrossoverHz);
        Assert.Equal(60e3, r.Ideal.CrossoverHz!.Value, 60e3 * 1e-6);

        // Analysing the design with the ideal network gives the same loop (the core's own path).
        var a = DesignAnalyzer.Analyze(design with { Compensator = r.IdealNetwork });
        Assert.Equal(r.Ideal.PhaseMarginDeg!.Value, a.Margins!.PhaseMarginDeg!.Value, 1e-6);
    }

    [Fact]
    public void Bad_options_name_the_field_and_the_allowed_range()
    {
        var plant = TestPlants.BuckPlant();
        var placement = Suggest(60e3, 45).Placement;
        Assert.False(NetworkSynthesizer.TrySynthesize(plant, placement, new SynthesisOptions { ResistorSeries = ESeries.E6 }, out _, out var issues));
        Assert.Contains(issues, i => i.Field == "synthesis.resistorSeries" && i.Message.Contains("E24, E48, E96, E192", StringComparison.Ordinal));
        Assert.False(NetworkSynthesizer.TrySynthesize(plant, placement, new SynthesisOptions { CapacitorSeries = ESeries.E96 }, out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.capacitorSeries");
        Assert.False(NetworkSynthesizer.TrySynthesize(plant, placement, new SynthesisOptions { R1Ohm = double.NaN }, out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.r1Ohm");
        Assert.False(NetworkSynthesizer.TrySynthesize(plant, placement, new SynthesisOptions { SearchSteps = 7 }, out _, out issues));
        Assert.Contains(issues, i => i.Field == "synthesis.searchSteps" && i.Message.Contains("1 to 3", StringComparison.Ordinal));
        var lag = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 1e3), Zero1Hz: 50e3, Pole1Hz: 5e3);
        Assert.False(NetworkSynthesizer.TrySynthesize(plant, lag, new SynthesisOptions(), out _, out issues));
        Assert.Contains(issues, i => i.Field == "compensator" && i.Message.Contains("pole above its zero", StringComparison.Ordinal) && !i.Message.Contains("Parameter", StringComparison.Ordinal));
    }
}
