namespace LoopShaper.Core.Design;

/// <summary>One design criterion checked against the analysis.</summary>
/// <param name="Name">What is checked ("phase margin").</param>
/// <param name="Field">The criteria field that sets the limit.</param>
/// <param name="Passed">True when the design meets it.</param>
/// <param name="Actual">The design's value, formatted with its unit, or "none in range".</param>
/// <param name="Limit">The limit, formatted with its unit.</param>
public sealed record CriterionResult(string Name, string Field, bool Passed, string Actual, string Limit);
