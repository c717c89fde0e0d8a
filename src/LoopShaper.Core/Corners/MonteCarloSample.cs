using System.Collections.Immutable;

namespace LoopShaper.Core.Corners;

/// <summary>One Monte Carlo sample: its parameter factors and values, its figures and the verdict.</summary>
/// <param name="Index">Sample index (0-based): with the seed it reproduces the sample.</param>
/// <param name="Factors">The factor of every parameter (order of <see cref="MonteCarloResult.Parameters"/>).</param>
/// <param name="Values">The value of every parameter, entered value x factor, in its own unit.</param>
/// <param name="Figures">Crossover and margins; null when the sample could not be analysed.</param>
/// <param name="Failures">The criteria missed; empty when the sample passes.</param>
public sealed record MonteCarloSample(int Index, ImmutableArray<double> Factors, ImmutableArray<double> Values, LoopFigures? Figures, ImmutableArray<string> Failures)
{
    /// <summary>True when the sample was analysed and meets every criterion.</summary>
    public bool Passed => Figures is not null && Failures.IsEmpty;
}
