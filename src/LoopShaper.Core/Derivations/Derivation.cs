namespace LoopShaper.Core.Derivations;

/// <summary>How one computed quantity was obtained: the formula, the design's numbers put in, the result and the source.</summary>
/// <param name="Quantity">What was computed, in words ("duty cycle with losses").</param>
/// <param name="Formula">The formula in symbols.</param>
/// <param name="Substituted">The formula with this design's numbers in it.</param>
/// <param name="Result">The result with its unit.</param>
/// <param name="Source">Where the formula comes from (book and section, paper), or "common practice, no source".</param>
public sealed record Derivation(string Quantity, string Formula, string Substituted, string Result, string Source);
