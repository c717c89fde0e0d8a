using System.Collections.Immutable;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>The outcome of a Monte Carlo run.</summary>
/// <param name="Settings">What was asked for.</param>
/// <param name="Parameters">The toleranced parameters; every sample's factors follow this order.</param>
/// <param name="Condition">Input voltage and load current of the analysis; null for custom plants.</param>
/// <param name="Completed">Samples analysed (fewer than asked when cancelled).</param>
/// <param name="Cancelled">True when the run was cancelled before the end.</param>
/// <param name="PassedCount">Samples that meet every criterion.</param>
/// <param name="Distributions">Distributions of crossover, phase margin, upper and lower gain margin (figures no sample has are left out).</param>
/// <param name="WorstSamples">The worst samples: failing ones first, then by smallest phase margin.</param>
/// <param name="FastPathCount">Samples evaluated by the direct frequency-domain evaluator (<see cref="DirectLoopEvaluator"/>); the rest by the full analysis.</param>
/// <param name="ElapsedS">Wall-clock time of the run, s.</param>
/// <param name="AllSamples">Every analysed sample, in index order, when <see cref="MonteCarloSettings.KeepAllSamples"/> asked for them; empty otherwise.</param>
/// <param name="CancelStopS">For a cancelled run: time from the cancel request to the end of sampling (the last sample in flight finished, no thread left computing), s, measured by the runner; the summary of the partial result comes after it. Null when not cancelled.</param>
public sealed record MonteCarloResult(
    MonteCarloSettings Settings,
    ImmutableArray<ToleranceParameter> Parameters,
    OperatingCondition? Condition,
    int Completed,
    bool Cancelled,
    int PassedCount,
    ImmutableArray<FigureDistribution> Distributions,
    ImmutableArray<MonteCarloSample> WorstSamples,
    int FastPathCount,
    double ElapsedS,
    ImmutableArray<MonteCarloSample> AllSamples,
    double? CancelStopS = null)
{
    /// <summary>Share of the analysed samples that meet every criterion, % (0 when none was analysed).</summary>
    public double YieldPct => Completed > 0 ? 100.0 * PassedCount / Completed : 0.0;

    /// <summary>The distribution of a figure by name; null when no sample has it.</summary>
    public FigureDistribution? Distribution(string figure) => Distributions.FirstOrDefault(d => d.Figure == figure);
}
