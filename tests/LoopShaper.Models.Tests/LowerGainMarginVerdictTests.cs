using LoopShaper.Core.Compensators;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Models.Tests;

/// <summary>
/// The lower gain margin of a conditionally stable loop is judged against criteria.minGainMarginDb at the design point,
/// at every corner and in every Monte Carlo sample, like the upper one.
/// </summary>
public class LowerGainMarginVerdictTests
{
    private const double RadPerS = 1.0 / (2 * Math.PI);

    /// <summary>
    /// T = k (1 + s)^2 / (s^3 (1 + s/100)^2), s in rad/s (the conditionally stable loop of MarginCasesTests, case 5, has k = 10):
    /// a custom plant 3 (1 + s)^2 / (s^2 (1 + s/100)^2) behind a Type I placement 1/s. The phase crosses -180 degrees at
    /// w = (99 -+ sqrt(9401)) / 2 rad/s (worked out there); with k = 3 the lower margin is
    /// -20 log10 |T(1.0209)| = -15.2 dB and the upper -20 log10 |T(97.979)| = +36.1 dB.
    /// </summary>
    private static LoopDesign ConditionallyStable(double minGainMarginDb)
    {
        var plant = new CustomPlant(CustomPlantForm.Factors, [], [], Gain: 3.0, OriginOrder: -2,
            Zeros: [Factor.Real(RadPerS), Factor.Real(RadPerS)], Poles: [Factor.Real(100 * RadPerS), Factor.Real(100 * RadPerS)]);
        var compensator = new CompensatorPlacement(CompensatorType.TypeI, new GainSetting(GainSettingKind.IntegratorHz, RadPerS));
        return new LoopDesign("conditionally stable", "lower gain margin verdict", plant, compensator,
            new AnalysisSettings(StartHz: 1e-3, StopHz: 1e4, StepSamples: 400),
            new DesignCriteria(MinPhaseMarginDeg: 0, MinGainMarginDb: minGainMarginDb, MaxCrossoverFractionOfSwitching: 1));
    }

    private static double Magnitude(double w) => 3.0 * (1 + (w * w)) / (w * w * w * (1 + (w * w / 1e4)));

    [Fact]
    public void The_test_loop_is_conditionally_stable_with_the_worked_out_margins()
    {
        var a = DesignAnalyzer.Analyze(ConditionallyStable(10));
        Assert.True(a.IsValid, string.Join("\n", a.Issues));
        var m = a.Margins!;
        double wa = (99.0 - Math.Sqrt(9401.0)) / 2.0, wb = (99.0 + Math.Sqrt(9401.0)) / 2.0;
        Assert.True(m.IsConditionallyStable);
        Assert.Equal(-20 * Math.Log10(Magnitude(wa)), m.LowerGainMarginDb!.Value, 1e-6);
        Assert.Equal(-20 * Math.Log10(Magnitude(wb)), m.UpperGainMarginDb!.Value, 1e-6);
        Assert.InRange(m.LowerGainMarginDb.Value, -16, -15);
        Assert.InRange(m.UpperGainMarginDb.Value, 36, 37);
    }

    [Fact]
    public void A_limit_above_the_lower_margin_fails_the_design_point_every_corner_and_every_sample()
    {
        // 20 dB: the upper margin (36 dB) passes, the lower one (-15 dB, only 15 dB of gain reduction) does not.
        var design = ConditionallyStable(20);
        var analysis = DesignAnalyzer.Analyze(design);
        Assert.False(analysis.MeetsCriteria);
        var failed = Assert.Single(analysis.Criteria, c => !c.Passed);
        Assert.Equal("lower gain margin", failed.Name);
        Assert.Equal("criteria.minGainMarginDb", failed.Field);

        var table = CornerSweep.Run(design, new CornerSweepOptions(IncludeResponses: false));
        Assert.NotEmpty(table.Rows);
        Assert.All(table.Rows, r => Assert.StartsWith("lower gain margin -15.", Assert.Single(r.Failures), StringComparison.Ordinal));
        Assert.False(table.AllPass);

        var mc = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 20, Seed: 4));
        Assert.Equal(20, mc.Completed);
        Assert.Equal(0, mc.PassedCount);
    }

    [Fact]
    public void A_limit_below_the_lower_margin_passes_everywhere()
    {
        // 12 dB: both margins are larger.
        var design = ConditionallyStable(12);
        Assert.True(DesignAnalyzer.Analyze(design).MeetsCriteria);
        Assert.True(CornerSweep.Run(design, new CornerSweepOptions(IncludeResponses: false)).AllPass);
        Assert.Equal(100.0, MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 20, Seed: 4)).YieldPct);
    }
}
