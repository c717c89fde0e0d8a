using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>OTA Type II synthesis with gm fixed (Basso 2012, ch. 3, OTA Type II; the inverse is exact algebra).</summary>
public class OtaSynthesisTests
{
    private static readonly Transconductance Ota = new(1e-3, 5e6);

    /// <summary>Placements of our own scenario: fi, fz, fp in Hz.</summary>
    public static TheoryData<double, double, double> Placements => new()
    {
        { 2e3, 3e3, 150e3 },
        { 500.0, 800.0, 40e3 },
        { 20e3, 10e3, 1e6 },
    };

    [Theory]
    [MemberData(nameof(Placements))]
    public void Placement_to_parts_to_placement_is_exact(double fi, double fz, double fp)
    {
        var placement = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, fi), Zero1Hz: fz, Pole1Hz: fp);
        var r = OtaNetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), placement, Ota, new SynthesisOptions());
        var back = r.IdealNetwork.ToPlacement();
        Assert.Equal(1.0, back.Gain.Value / fi, 1e-9);
        Assert.Equal(1.0, back.Zero1Hz!.Value / fz, 1e-9);
        Assert.Equal(1.0, back.Pole1Hz!.Value / fp, 1e-9);
        Assert.Equal(GainSettingKind.IntegratorHz, back.Gain.Kind);

        // The same inverse on plain numbers (OtaSynthesis with Hdiv = 1) gives the same parts.
        var plain = OtaSynthesis.TypeII(Ota.TransconductanceS, 1.0, fi, fz, fp);
        Assert.Equal(plain.R2Ohm, r.IdealNetwork.R2Ohm, 1e-9 * plain.R2Ohm);
        Assert.Equal(plain.C1F, r.IdealNetwork.C1F, 1e-9 * plain.C1F);
        Assert.Equal(plain.C2F, r.IdealNetwork.C2F, 1e-9 * plain.C2F);
    }

    /// <summary>Targets of our own for the current-mode stand-in plant: crossover Hz, phase margin deg, OTA output resistance Ohm.</summary>
    public static TheoryData<double, double, double> Targets => new()
    {
        { 30e3, 60.0, 5e6 },
        { 20e3, 70.0, 5e6 },
        { 50e3, 50.0, 1e9 },
    };

    [Theory]
    [MemberData(nameof(Targets))]
    public void Ideal_parts_put_crossover_and_phase_margin_on_target(double fc, double pm, double roOhm)
    {
        // Venable's K factor for Type II (Venable 1983) on the peak current-mode stand-in plant (TestPlants), then R2,
        // C1, C2 with gm = 1 mS fixed; the loop of the ideal parts, Ro included, analysed independently of the synthesis.
        var plant = TestPlants.CurrentModePlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, fc, pm, CompensatorType.TypeII, 600e3));
        var ota = new Transconductance(1e-3, roOhm);
        var r = OtaNetworkSynthesizer.Synthesize(plant, s.Placement, ota, new SynthesisOptions { StopHz = 10e6 });
        Assert.Equal(CompensatorType.TypeII, r.IdealNetwork.Type);

        // The synthesis inverts the placement with Ro infinite; a finite Ro (5 MOhm) moves the crossover by about 1e-4
        // relative and the phase margin by under 0.02 deg here (1e-7 and 1e-4 deg with 1 GOhm), inside the tolerances.
        var m = MarginAnalyzer.Analyze(r.IdealNetwork.TransferFunction().Multiply(plant), 10, 10e6);
        Assert.Equal(fc, m.CrossoverHz!.Value, fc * 1e-3);
        Assert.Equal(pm, m.PhaseMarginDeg!.Value, 0.1);
        Assert.Equal(m.CrossoverHz.Value, r.Ideal.CrossoverHz!.Value, fc * 1e-9);
        Assert.Equal(m.PhaseMarginDeg.Value, r.Ideal.PhaseMarginDeg!.Value, 1e-9);

        // Snapping moves them (E96 / E12 steps): the snapped loop is analysed too, and is not the ideal one.
        Assert.NotEqual(r.Ideal.PhaseMarginDeg.Value, r.Snapped.PhaseMarginDeg!.Value);
    }

    [Fact]
    public void Parts_snap_to_the_chosen_series_with_designators_and_roles()
    {
        var placement = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 2e3), Zero1Hz: 3e3, Pole1Hz: 150e3);
        var r = OtaNetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), placement, Ota, new SynthesisOptions { ResistorSeries = ESeries.E24, CapacitorSeries = ESeries.E6 });
        Assert.Equal(["R2", "C1", "C2"], r.Parts.Select(p => p.Designator));
        Assert.All(r.Parts, p => Assert.True(StandardValues.IsPreferred(p.Value.Value, p.Kind == PartKind.Resistor ? ESeries.E24 : ESeries.E6)));
        Assert.All(r.Parts, p => Assert.False(string.IsNullOrWhiteSpace(p.Role)));
        Assert.Equal(r.Parts.First(p => p.Designator == "R2").Value.Value, r.SnappedNetwork.R2Ohm);
        Assert.Equal(Ota, r.SnappedNetwork.Amplifier);

        // Both loops analysed: snapped parts move the crossover a little, not a lot (E6 steps are at most ~+-23 %).
        Assert.NotNull(r.Ideal.CrossoverHz);
        Assert.NotNull(r.Snapped.CrossoverHz);
        Assert.InRange(r.Snapped.CrossoverHz!.Value / r.Ideal.CrossoverHz!.Value, 0.7, 1.4);

        // Parts CSV parsed back gives the same values.
        var back = PartsListCsv.Parse(PartsListCsv.Write(r)).ToDictionary(e => e.Designator);
        Assert.All(r.Parts, p => Assert.Equal(p.Value.Value, back[p.Designator].Value, 1e-12 * p.Value.Value));
    }

    /// <summary>Searches of our own on the current-mode stand-in plant: crossover Hz, phase margin deg, resistor series, capacitor series, steps.</summary>
    public static TheoryData<double, double, ESeries, ESeries, int> Searches => new()
    {
        { 30e3, 60.0, ESeries.E24, ESeries.E6, 1 },
        { 20e3, 70.0, ESeries.E24, ESeries.E6, 2 },
        { 50e3, 50.0, ESeries.E96, ESeries.E12, 3 },
    };

    [Theory]
    [MemberData(nameof(Searches))]
    public void Neighbour_search_is_never_farther_from_the_targets_than_snapping_and_stays_within_its_steps(double fc, double pm, ESeries resistors, ESeries capacitors, int steps)
    {
        // Venable's K factor (Venable 1983) places the Type II; R2, C1, C2 follow with gm = 1 mS fixed, then the search.
        var plant = TestPlants.CurrentModePlant();
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, fc, pm, CompensatorType.TypeII, 600e3));
        var o = new SynthesisOptions { ResistorSeries = resistors, CapacitorSeries = capacitors, SearchNeighbours = true, SearchSteps = steps, StopHz = 10e6 };
        var r = OtaNetworkSynthesizer.Synthesize(plant, s.Placement, Ota, o);
        Assert.NotNull(r.Search);
        var search = r.Search!;
        Assert.Equal((int)Math.Pow((2 * steps) + 1, 3), search.CandidatesTried); // R2, C1, C2 free

        // Distances computed here from full margin analyses of the snapped and the chosen network, not taken from the
        // search: distance = (100 ln(fc / fc0))^2 + (PM - PM0)^2 with the default scales of 1 % and 1 deg.
        double Distance(TransconductanceNetwork n)
        {
            var m = MarginAnalyzer.Analyze(n.TransferFunction().Multiply(plant), 10, 10e6);
            double a = 100 * Math.Log(m.CrossoverHz!.Value / r.TargetCrossoverHz), b = m.PhaseMarginDeg!.Value - r.TargetPhaseMarginDeg;
            return (a * a) + (b * b);
        }

        double snapped = Distance(r.SnappedNetwork), chosen = Distance(r.ChosenNetwork);
        Assert.True(chosen <= snapped, $"searched {chosen} vs snapped {snapped}");
        Assert.Equal(snapped, search.SnappedDistance, 1e-9 * Math.Max(1, snapped));
        Assert.Equal(chosen, search.Distance, 1e-9 * Math.Max(1, chosen));

        // Every chosen value is a member of its series within +-steps ladder positions of the snapped one; the ladder is
        // rebuilt here from IEC 60063 positions (StandardValues.ValueAt) around a fresh snap of the ideal value.
        Assert.Equal(["R2", "C1", "C2"], search.Parts.Select(p => p.Designator));
        foreach (var (p, q) in r.Parts.Zip(search.Parts))
        {
            var series = p.Kind == PartKind.Resistor ? resistors : capacitors;
            var fresh = StandardValues.Snap(p.Value.IdealValue, series);
            var allowed = Enumerable.Range(-steps, (2 * steps) + 1).Select(k => StandardValues.ValueAt(series, fresh.Index + k)).ToArray();
            Assert.Equal(series, q.Value.Series);
            Assert.True(StandardValues.IsPreferred(q.Value.Value, series), $"{q.Designator} = {q.Value.Value} is not an {series} value");
            Assert.Contains(allowed, v => Math.Abs(v - q.Value.Value) <= 1e-12 * v);
            Assert.Equal(p.Value.IdealValue, q.Value.IdealValue);
        }

        // gm and Ro are the anchors: the chosen network keeps the amplifier; its values are the chosen parts'.
        Assert.Same(search.Network, r.ChosenNetwork);
        Assert.Equal(Ota, r.ChosenNetwork.Amplifier);
        Assert.Equal(search.Parts.Single(p => p.Designator == "C2").Value.Value, r.ChosenNetwork.C2F);
        Assert.Equal(search.Performance, r.Chosen);
        Assert.Contains(r.Derivations, d => d.Quantity == "Neighbour search" && d.Formula.Contains("gm and the divider fixed", StringComparison.Ordinal));
        Assert.Contains(r.Derivations, d => d.Quantity == "Loop with the searched parts");
        Assert.DoesNotContain(r.Warnings, w => w.Contains("op-amp networks only", StringComparison.Ordinal) && w.Contains("neighbour", StringComparison.Ordinal));

        // Without the search the snapped parts are the chosen ones.
        var plain = OtaNetworkSynthesizer.Synthesize(plant, s.Placement, Ota, o with { SearchNeighbours = false });
        Assert.Null(plain.Search);
        Assert.Equal(plain.SnappedNetwork, plain.ChosenNetwork);
        Assert.DoesNotContain(plain.Derivations, d => d.Quantity == "Neighbour search");
    }

    [Fact]
    public void Impractical_values_and_bad_placements_are_named()
    {
        // gm = 1 mS with fi = 200 kHz: C1 + C2 = gm / (2 pi fi) = 796 pF and fz/fp = 1/100 gives C2 = 8 pF, below 10 pF.
        var placement = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 200e3), Zero1Hz: 1e3, Pole1Hz: 100e3);
        var r = OtaNetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), placement, Ota, new SynthesisOptions());
        Assert.Contains(r.Warnings, w => w.StartsWith("C2 = ", StringComparison.Ordinal) && w.Contains("below 10 pF", StringComparison.Ordinal));
        // R2 = 1 / (2 pi fz C1) = 1 / (2 pi 1 kHz 788 pF) = 202 kOhm: practical, no warning for it.
        Assert.DoesNotContain(r.Warnings, w => w.StartsWith("R2 = ", StringComparison.Ordinal));

        var inverted = placement with { Pole1Hz = 500.0 };
        var ex = Assert.Throws<ArgumentException>(() => OtaNetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), inverted, Ota, new SynthesisOptions()));
        Assert.Contains("pole above its zero", ex.Message, StringComparison.Ordinal);
        var typeIII = new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.IntegratorHz, 1e3), 1e3, 2e3, 50e3, 100e3);
        Assert.Throws<ArgumentException>(() => OtaNetworkSynthesizer.Synthesize(TestPlants.BuckPlant(), typeIII, Ota, new SynthesisOptions()));
    }
}
