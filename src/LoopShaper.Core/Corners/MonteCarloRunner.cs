using System.Collections.Immutable;
using System.Diagnostics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>
/// Monte Carlo analysis of a design's tolerances: N samples, each parameter's factor drawn uniform or normal within its
/// band from a stream that depends on (seed, sample index) only (<see cref="SampleRandom"/>), so runs are reproducible
/// on any number of threads. The samples are spread over every core; each is evaluated by the direct frequency-domain
/// evaluator where it supports the design (<see cref="DirectLoopEvaluator"/>, checked against the full analysis by the
/// tests), else by the full analysis. Cancellation stops the run between samples; the result then covers the samples done.
/// </summary>
public static class MonteCarloRunner
{
    private const int ChunkSize = 8;

    /// <summary>Runs the samples. Progress is reported about every 1 % of the samples.</summary>
    public static MonteCarloResult Run(LoopDesign design, MonteCarloSettings settings, IProgress<MonteCarloProgress>? progress = null, CancellationToken cancellation = default)
    {
        if (settings.Samples < 1 || settings.Samples > MonteCarloSettings.MaxSamples)
        {
            throw new ArgumentOutOfRangeException(nameof(settings), $"samples must be 1 to {MonteCarloSettings.MaxSamples}; got {settings.Samples}.");
        }

        var clock = Stopwatch.StartNew();
        long cancelAsked = 0;
        using var onCancel = cancellation.Register(() => Interlocked.CompareExchange(ref cancelAsked, Stopwatch.GetTimestamp(), 0));
        design = CornerSweep.Fixed(design);
        var parameters = ToleranceModel.Parameters(design, settings.Tolerances);
        var at = ConditionOf(design, settings);
        int n = settings.Samples;
        var figures = new LoopFigures?[n];
        var failures = new ImmutableArray<string>[n];
        var done = new bool[n];
        var fast = new bool[n];
        int completed = 0, lastReported = 0, step = Math.Max(n / 100, 1);
        bool directOk = DirectLoopEvaluator.Supports(design);
        double? fsw = design.Plant switch { BuckPlant b => b.PowerStage.SwitchingFrequencyHz, CustomPlant c => c.SwitchingFrequencyHz, _ => null };
        int chunks = (n + ChunkSize - 1) / ChunkSize;
        var po = new ParallelOptions { MaxDegreeOfParallelism = settings.MaxDegreeOfParallelism ?? Environment.ProcessorCount };
        Parallel.For(0, chunks, po, () => directOk ? new DirectLoopEvaluator(design, parameters, at) : null, (chunk, state, direct) =>
        {
            int end = Math.Min((chunk + 1) * ChunkSize, n);
            int count = 0;
            for (int i = chunk * ChunkSize; i < end; i++)
            {
                if (cancellation.IsCancellationRequested)
                {
                    state.Stop();
                    break;
                }

                var f = Factors(parameters, settings, i);
                LoopFigures? lf = direct?.Evaluate(f);
                fast[i] = lf is not null;
                lf ??= FullFigures(design, parameters, f, at);
                figures[i] = lf;
                failures[i] = lf is null ? ["not analysed"] : CornerVerdict.Failures(lf, design.Criteria, fsw);
                done[i] = true;
                count++;
            }

            int total = Interlocked.Add(ref completed, count);
            if (progress is not null && total - Volatile.Read(ref lastReported) >= step)
            {
                Volatile.Write(ref lastReported, total);
                progress.Report(new MonteCarloProgress(total, n));
            }

            return direct;
        }, _ => { });

        long sampled = Stopwatch.GetTimestamp();
        bool cancelled = cancellation.IsCancellationRequested && completed < n;
        // The token reads as cancelled before its callbacks have run on the cancelling thread: wait (briefly) for ours.
        long asked = Interlocked.Read(ref cancelAsked);
        for (var spin = new SpinWait(); cancelled && asked == 0 && spin.Count < 200; spin.SpinOnce())
        {
            asked = Interlocked.Read(ref cancelAsked);
        }

        double? cancelStopS = cancelled && asked != 0 ? Math.Max(Stopwatch.GetElapsedTime(asked, sampled).TotalSeconds, 0.0) : null;
        // The summary: plain loops and one sort per figure, so that a cancelled run returns promptly after sampling.
        var indices = new List<int>(completed);
        int passed = 0;
        for (int i = 0; i < n; i++)
        {
            if (done[i])
            {
                indices.Add(i);
                passed += figures[i] is not null && failures[i].IsEmpty ? 1 : 0;
            }
        }

        var dists = new List<FigureDistribution>();
        var values = new double?[indices.Count];
        void Add(string name, Func<LoopFigures, double?> pick)
        {
            for (int k = 0; k < values.Length; k++)
            {
                values[k] = figures[indices[k]] is { } lf ? pick(lf) : null;
            }

            if (FigureDistribution.Of(name, values, settings.HistogramBins) is { } d)
            {
                dists.Add(d);
            }
        }

        Add("crossoverHz", f => f.CrossoverHz);
        Add("phaseMarginDeg", f => f.PhaseMarginDeg);
        Add("upperGainMarginDb", f => f.UpperGainMarginDb);
        Add("lowerGainMarginDb", f => f.LowerGainMarginDb);
        var worst = WorstSamples(indices, figures, failures, Math.Max(settings.WorstCount, 0))
            .Select(i => SampleOf(parameters, settings, i, figures[i], failures[i]))
            .ToImmutableArray();
        progress?.Report(new MonteCarloProgress(completed, n));
        return new MonteCarloResult(settings, parameters, at, completed, cancelled, passed, [.. dists], worst, indices.Count(i => fast[i]), clock.Elapsed.TotalSeconds,
            settings.KeepAllSamples ? [.. indices.Select(i => SampleOf(parameters, settings, i, figures[i], failures[i]))] : [], cancelStopS);
    }

    /// <summary>
    /// The <paramref name="count"/> worst samples, worst first: failing before passing, then the smallest phase margin
    /// (none counts as smallest), ties in sample order. A bounded insertion, not a sort of every sample.
    /// </summary>
    private static List<int> WorstSamples(List<int> indices, LoopFigures?[] figures, ImmutableArray<string>[] failures, int count)
    {
        var kept = new List<(int Pass, double Pm, int Index)>(count + 1);
        foreach (int i in indices)
        {
            var key = (Pass: figures[i] is not null && failures[i].IsEmpty ? 1 : 0, Pm: figures[i]?.PhaseMarginDeg ?? double.NegativeInfinity, Index: i);
            if (count == 0 || (kept.Count == count && !Before(key, kept[^1])))
            {
                continue;
            }

            int at = kept.Count;
            while (at > 0 && Before(key, kept[at - 1]))
            {
                at--;
            }

            kept.Insert(at, key);
            if (kept.Count > count)
            {
                kept.RemoveAt(kept.Count - 1);
            }
        }

        return kept.ConvertAll(k => k.Index);

        static bool Before((int Pass, double Pm, int Index) a, (int Pass, double Pm, int Index) b)
            => a.Pass != b.Pass ? a.Pass < b.Pass : a.Pm < b.Pm;
    }

    /// <summary>The factors of sample <paramref name="index"/>: uniform in [low, high], or normal about the centre with sigma = (high - low) / 6.</summary>
    public static double[] Factors(ImmutableArray<ToleranceParameter> parameters, MonteCarloSettings settings, int index)
    {
        var rng = new SampleRandom(settings.Seed, index);
        var f = new double[parameters.Length];
        for (int k = 0; k < f.Length; k++)
        {
            var p = parameters[k];
            f[k] = settings.Distribution == SampleDistribution.Normal
                ? p.CentreFactor + (p.SigmaFactor * rng.NextNormal())
                : p.LowFactor + ((p.HighFactor - p.LowFactor) * rng.NextUniform());
            f[k] = Math.Max(f[k], 1e-6 * p.NominalFactor);
        }

        return f;
    }

    /// <summary>The design of a sample, to open as a design of its own (a crossover-target placement resolved as in the run).</summary>
    public static LoopDesign ToDesign(LoopDesign design, MonteCarloResult result, MonteCarloSample sample)
    {
        var d = ToleranceModel.Apply(CornerSweep.Fixed(design), result.Parameters, sample.Factors);
        return d with { Name = $"{design.Name} (sample {sample.Index})" };
    }

    /// <summary>The analysis condition of a run.</summary>
    public static OperatingCondition? ConditionOf(LoopDesign design, MonteCarloSettings settings)
        => design.Plant is BuckPlant b ? DesignAnalyzer.ConditionOf(b.PowerStage, design.Analysis with { Input = settings.Input ?? design.Analysis.Input, Load = settings.Load ?? design.Analysis.Load }) : null;

    /// <summary>The figures of a sample by the full analysis (operating point, model, <see cref="MarginAnalyzer"/>); null when it cannot be analysed.</summary>
    public static LoopFigures? FullFigures(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, IReadOnlyList<double> factors, OperatingCondition? at)
    {
        try
        {
            var d = ToleranceModel.Apply(design, parameters, factors);
            return LoopFigures.From(MarginAnalyzer.Analyze(DesignAnalyzer.BuildLoop(d, at).Loop.LoopGain, d.Analysis.StartHz, d.Analysis.StopHz));
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return null;
        }
    }

    private static MonteCarloSample SampleOf(ImmutableArray<ToleranceParameter> parameters, MonteCarloSettings settings, int index, LoopFigures? figures, ImmutableArray<string> failures)
    {
        var f = Factors(parameters, settings, index);
        return new MonteCarloSample(index, [.. f], [.. f.Select((x, k) => parameters[k].ValueAt(x))], figures, failures);
    }
}
