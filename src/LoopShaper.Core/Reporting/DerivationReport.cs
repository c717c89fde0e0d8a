namespace LoopShaper.Core.Reporting;

/// <summary>One derivation step: what was computed, the formula, the numbers put in, the result and its source.</summary>
/// <param name="Quantity">What was computed.</param>
/// <param name="Formula">The formula in symbols.</param>
/// <param name="Substituted">The formula with the design's numbers.</param>
/// <param name="Result">The result with its unit.</param>
/// <param name="Source">Book and section, paper, or "common practice, no source".</param>
public sealed record DerivationReport(string Quantity, string Formula, string Substituted, string Result, string Source);
