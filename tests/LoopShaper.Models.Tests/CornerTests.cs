using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>The corner table against the same designs analysed one by one, and the shape of the table.</summary>
public class CornerTests
{
    /// <summary>Our scenario: the 12 V to 3.3 V rail in voltage mode with an ideal Type III op-amp network (parts fixed).</summary>
    internal static LoopDesign VoltageModeRail() => TestStages.Design(
        TestStages.PointOfLoad(),
        new VoltageModeControl(1.0),
        new OpAmpNetwork(CompensatorType.TypeIII, 10e3, C1F: 4.7e-9, R2Ohm: 8.2e3, C2F: 100e-12, R3Ohm: 330, C3F: 3.3e-9),
        new AnalysisSettings(StartHz: 10, StopHz: 1e7, StepSamples: 800));

    [Fact]
    public void Full_set_has_36_corners_over_three_inputs_three_loads_four_tolerance_sets()
    {
        Assert.Equal(36, CornerSet.Full.Length);
        Assert.Equal(36, CornerSet.Full.Distinct().Count());
        Assert.Equal(3, CornerSet.Full.Select(c => c.Load).Distinct().Count());
    }

    [Fact]
    public void Worst_case_phase_margin_equals_the_minimum_over_the_same_designs_analysed_one_by_one()
    {
        var design = VoltageModeRail();
        var table = CornerSweep.Run(design, new CornerSweepOptions(IncludeResponses: false, IncludeLoadStep: false));
        var one = new List<double>();
        for (int i = 0; i < table.Rows.Length; i++)
        {
            var row = table.Rows[i];
            // The same corner by hand: parameters applied, operating condition, full analysis.
            var d = ToleranceModel.Apply(design, table.Parameters, row.Factors);
            var at = DesignAnalyzer.ConditionOf(((BuckPlant)d.Plant).PowerStage, new AnalysisSettings(Input: row.Corner.Input, Load: row.Corner.Load));
            var m = MarginAnalyzer.Analyze(DesignAnalyzer.BuildLoop(d, at).Loop.LoopGain, d.Analysis.StartHz, d.Analysis.StopHz);
            one.Add(m.PhaseMarginDeg!.Value);
            Assert.Equal(m.PhaseMarginDeg!.Value, row.Figures!.PhaseMarginDeg!.Value, 9);
        }

        Assert.Equal(one.Min(), table.WorstPhaseMarginDeg!.Value, 9);
        Assert.Equal(one.IndexOf(one.Min()), table.Worst.PhaseMargin);
    }

    [Fact]
    public void Every_analysed_row_reports_the_same_figures_and_the_overlay_draws_the_worst_last()
    {
        var table = CornerSweep.Run(VoltageModeRail());
        Assert.All(table.Rows, r =>
        {
            Assert.NotNull(r.Figures);
            Assert.NotNull(r.Figures!.CrossoverHz);
            Assert.NotNull(r.Figures.PhaseMarginDeg);
            Assert.NotNull(r.Model);
            Assert.NotNull(r.LoadStepDeviationV);
            Assert.NotNull(r.LoopResponse);
            Assert.Equal(table.Parameters.Length, r.Factors.Length);
        });
        Assert.Equal(table.Rows.Length, table.OverlayOrder().Count());
        Assert.Same(table.Rows[table.Worst.PhaseMargin!.Value], table.OverlayOrder().Last());
    }

    [Fact]
    public void All_low_and_all_high_move_every_parameter_to_its_band_edges()
    {
        var design = VoltageModeRail();
        var p = ToleranceModel.Parameters(design);
        var l = p.Single(x => x.Name == "L");
        Assert.Equal(0.8, l.LowFactor, 12);   // default +-20 % (common practice, no source)
        Assert.Equal(1.2, l.HighFactor, 12);
        var low = ToleranceModel.Apply(design, p, ToleranceModel.Factors(p, ToleranceSet.AllLow));
        var stage = ((BuckPlant)low.Plant).PowerStage;
        Assert.Equal(4.7e-6 * 0.8, stage.Inductor.InductanceH, 15);
        Assert.Equal(40e-6 * 0.8, stage.OutputCapacitors[0].CapacitanceF, 15);
        Assert.Equal(3e-3 * 0.8, stage.OutputCapacitors[0].EsrOhm, 15);   // ESR x0.8 at the cold-hot low end
        Assert.Equal(10e3 * 0.99, ((OpAmpNetwork)low.Compensator).R1Ohm, 9);   // 1 % resistors
    }

    [Fact]
    public void Dc_bias_factor_derates_the_capacitance_at_every_corner()
    {
        var design = VoltageModeRail() with { Tolerances = new ToleranceSpec { Capacitors = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, [KeyValuePair.Create("ceramic 47u 1210", new CapacitorTolerance(10, 0.6))]) } };
        var p = ToleranceModel.Parameters(design);
        var c = p.Single(x => x.Name == "C[ceramic 47u 1210]");
        Assert.Equal(0.6, c.NominalFactor, 12);
        Assert.Equal(0.54, c.LowFactor, 12);
        Assert.Equal(0.66, c.HighFactor, 12);
    }

    [Fact]
    public void A_design_that_fails_at_one_input_corner_fails_the_table()
    {
        // Phase margin limit set just above the nominal-parts value at nominal input and full load: some corners fail.
        var design = VoltageModeRail();
        var table = CornerSweep.Run(design, new CornerSweepOptions(IncludeResponses: false, IncludeLoadStep: false));
        double worst = table.WorstPhaseMarginDeg!.Value;
        var strict = design with { Criteria = design.Criteria with { MinPhaseMarginDeg = worst + 0.01, MinGainMarginDb = 0, MaxCrossoverFractionOfSwitching = 1 } };
        var strictTable = CornerSweep.Run(strict, new CornerSweepOptions(IncludeResponses: false, IncludeLoadStep: false));
        Assert.False(strictTable.AllPass);
        Assert.Contains(strictTable.Rows, r => r.Passed);
        Assert.Single(strictTable.Failing);
    }
}
