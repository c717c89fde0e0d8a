using System.Collections.Immutable;

namespace LoopShaper.Core.Analysis;

/// <summary>The response of a transfer function to a unit step, sampled exactly at equal time steps, with its figures.</summary>
/// <param name="TimeS">Sample times in seconds.</param>
/// <param name="Value">Output at each time.</param>
/// <param name="Metrics">Overshoot, settling and the rest.</param>
/// <param name="Delay">How a pure delay was treated.</param>
/// <param name="PadeOrder">Order of the Pade approximation when one was used.</param>
public sealed record StepResponse(ImmutableArray<double> TimeS, ImmutableArray<double> Value, StepMetrics Metrics, DelayTreatment Delay, int? PadeOrder);
