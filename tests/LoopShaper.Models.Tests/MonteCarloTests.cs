using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Models.Tests;

/// <summary>Reproducibility, the sampled distributions, yield, cancellation and the fast path against the full analysis.</summary>
public class MonteCarloTests
{
    [Fact]
    public void Same_seed_gives_the_same_results_on_one_thread_or_two()
    {
        var design = CornerTests.VoltageModeRail();
        var a = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 300, Seed: 42, MaxDegreeOfParallelism: 1));
        var b = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 300, Seed: 42, MaxDegreeOfParallelism: 2));
        var c = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 300, Seed: 43));
        Assert.Equal(a.PassedCount, b.PassedCount);
        Assert.Equal(a.Distribution("phaseMarginDeg")!.P50, b.Distribution("phaseMarginDeg")!.P50);
        Assert.Equal(a.WorstSamples.Select(s => s.Index), b.WorstSamples.Select(s => s.Index));
        Assert.Equal(a.WorstSamples[0].Factors.ToArray(), b.WorstSamples[0].Factors.ToArray());
        Assert.NotEqual(a.Distribution("phaseMarginDeg")!.Mean, c.Distribution("phaseMarginDeg")!.Mean);
        Assert.Null(a.CancelStopS);
        Assert.False(a.Cancelled);
    }

    [Theory]
    [InlineData(SampleDistribution.Uniform)]
    [InlineData(SampleDistribution.Normal)]
    public void Sampled_factors_have_the_requested_mean_and_spread(SampleDistribution distribution)
    {
        var p = ToleranceModel.Parameters(CornerTests.VoltageModeRail());
        var settings = new MonteCarloSettings(Seed: 7, Distribution: distribution);
        const int n = 20000;
        var draws = Enumerable.Range(0, n).Select(i => MonteCarloRunner.Factors(p, settings, i)).ToArray();
        for (int k = 0; k < p.Length; k++)
        {
            var x = draws.Select(d => d[k]).ToArray();
            double mean = x.Average(), sd = Math.Sqrt(x.Sum(v => (v - mean) * (v - mean)) / (n - 1));
            double width = p[k].HighFactor - p[k].LowFactor;
            // Uniform on [a, b]: sd = (b - a) / sqrt(12); normal: sd = (b - a) / 6 (tolerance = 3 sigma). Textbook moments.
            double expectedSd = distribution == SampleDistribution.Uniform ? width / Math.Sqrt(12) : width / 6;
            // Sampling error of the mean is sd / sqrt(n); of the sd about sd / sqrt(2 n). Five standard errors.
            Assert.InRange(mean, p[k].CentreFactor - (5 * expectedSd / Math.Sqrt(n)), p[k].CentreFactor + (5 * expectedSd / Math.Sqrt(n)));
            Assert.InRange(sd, expectedSd * (1 - (5 / Math.Sqrt(2.0 * n))), expectedSd * (1 + (5 / Math.Sqrt(2.0 * n))));
            if (distribution == SampleDistribution.Uniform)
            {
                Assert.All(x, v => Assert.InRange(v, p[k].LowFactor, p[k].HighFactor));
            }
            else
            {
                // 0.27 % of a normal lies beyond 3 sigma (standard normal table); allow for sampling error.
                double outside = x.Count(v => v < p[k].LowFactor || v > p[k].HighFactor) / (double)n;
                Assert.InRange(outside, 0.0, 0.006);
            }
        }
    }

    [Fact]
    public void A_design_that_always_passes_has_a_yield_of_100_percent()
    {
        var design = CornerTests.VoltageModeRail();
        // Loose criteria every sample meets (the corners of this design all have more than 30 degrees).
        var loose = design with { Criteria = new DesignCriteria(MinPhaseMarginDeg: 20, MinGainMarginDb: 3, MaxCrossoverFractionOfSwitching: 0.5) };
        var r = MonteCarloRunner.Run(loose, new MonteCarloSettings(Samples: 500, Seed: 3));
        Assert.Equal(500, r.Completed);
        Assert.Equal(100.0, r.YieldPct);
        var strict = design with { Criteria = new DesignCriteria(MinCrossoverHz: 1e9) };
        Assert.Equal(0.0, MonteCarloRunner.Run(strict, new MonteCarloSettings(Samples: 100, Seed: 3)).YieldPct);
    }

    [Fact]
    public void A_worst_sample_opens_as_a_design_with_its_parameter_values()
    {
        var design = CornerTests.VoltageModeRail();
        var r = MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 200, Seed: 5, WorstCount: 3));
        var worst = r.WorstSamples[0];
        var opened = MonteCarloRunner.ToDesign(design, r, worst);
        int l = r.Parameters.IndexOf(r.Parameters.Single(p => p.Name == "L"));
        Assert.Equal(worst.Values[l], ((BuckPlant)opened.Plant).PowerStage.Inductor.InductanceH, 1e-12 * worst.Values[l]);
        var full = DesignAnalyzer.Analyze(opened with { Analysis = opened.Analysis with { Input = design.Analysis.Input, Load = design.Analysis.Load } });
        Assert.Equal(worst.Figures!.PhaseMarginDeg!.Value, full.Margins!.PhaseMarginDeg!.Value, 6);
        Assert.True(worst.Figures.PhaseMarginDeg <= r.Distribution("phaseMarginDeg")!.Min + 1e-9);
    }

    [Fact]
    public async Task Cancelling_a_long_run_returns_within_100_ms()
    {
        var design = CornerTests.VoltageModeRail();
        using var cts = new CancellationTokenSource();
        var started = new ManualResetEventSlim();
        var progress = new SynchronousProgress(_ => started.Set());
        var task = Task.Run(() => MonteCarloRunner.Run(design, new MonteCarloSettings(Samples: 100_000, Seed: 1), progress, cts.Token));
        Assert.True(started.Wait(TimeSpan.FromSeconds(30)));
        var clock = System.Diagnostics.Stopwatch.StartNew();
        cts.Cancel();
        var result = await task;
        double ms = clock.Elapsed.TotalMilliseconds;
        Assert.True(result.Cancelled);
        Assert.True(result.Completed < 100_000);
        Assert.True(ms < 100, $"returned {ms:F0} ms after cancel");

        // The runner's own measure: cancel request to the end of sampling, before the partial summary and the return.
        Assert.NotNull(result.CancelStopS);
        Assert.InRange(1000 * result.CancelStopS!.Value, 0, ms);
    }

    [Fact]
    public void Fast_path_agrees_with_the_full_analysis_on_many_samples()
    {
        // Voltage mode with a Type III network, peak current mode with an OTA, and a DCM diode rail.
        var designs = new[]
        {
            CornerTests.VoltageModeRail(),
            TestStages.Design(TestStages.PointOfLoad(), TestStages.HalfOffSlope(), new LoopShaper.Core.Compensators.TransconductanceNetwork(LoopShaper.Core.Compensators.CompensatorType.TypeII, new LoopShaper.Core.Compensators.Transconductance(1e-3, 5e6), 2.2e-9, 20e3, 47e-12)),
            TestStages.Design(TestStages.DiodeRail(), new VoltageModeControl(1.5), TestStages.TypeII(8e3, 600, 60e3), new AnalysisSettings(StartHz: 10, StopHz: 1e7, Load: LoadCorner.Min)),
        };
        int compared = 0;
        foreach (var raw in designs)
        {
            var design = CornerSweep.Fixed(raw);
            var settings = new MonteCarloSettings(Seed: 11);
            var p = ToleranceModel.Parameters(design);
            var at = MonteCarloRunner.ConditionOf(design, settings);
            var fast = new DirectLoopEvaluator(design, p, at);
            for (int i = 0; i < 150; i++)
            {
                var f = MonteCarloRunner.Factors(p, settings, i);
                var a = fast.Evaluate(f);
                var b = MonteCarloRunner.FullFigures(design, p, f, at);
                Assert.NotNull(b);
                if (a is null)
                {
                    continue;
                }

                compared++;
                Assert.Equal(b!.IsClosedLoopStable, a.IsClosedLoopStable);
                Assert.Equal(b.CrossoverCount, a.CrossoverCount);
                // Both solve |T| = 1 and the phase crossings by Brent's method on the same model: agreement to round-off
                // of the two evaluations (factor form vs impedance form), far below the figures' meaning.
                Assert.Equal(b.PhaseMarginDeg!.Value, a.PhaseMarginDeg!.Value, 6);
                Assert.Equal(b.CrossoverHz!.Value, a.CrossoverHz!.Value, 1e-6 * b.CrossoverHz.Value);
                Assert.Equal(b.UpperGainMarginDb is null, a.UpperGainMarginDb is null);
                if (b.UpperGainMarginDb is double gb)
                {
                    Assert.Equal(gb, a.UpperGainMarginDb!.Value, 6);
                }
            }
        }

        Assert.True(compared >= 400, $"only {compared} samples took the fast path");
    }

    /// <summary>An IProgress that calls back on the reporting thread (Progress&lt;T&gt; would post to the thread pool).</summary>
    private sealed class SynchronousProgress(Action<MonteCarloProgress> report) : IProgress<MonteCarloProgress>
    {
        public void Report(MonteCarloProgress value) => report(value);
    }
}
