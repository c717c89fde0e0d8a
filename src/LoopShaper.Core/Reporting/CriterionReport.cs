namespace LoopShaper.Core.Reporting;

/// <summary>One design criterion and whether the design meets it.</summary>
/// <param name="Name">What is checked.</param>
/// <param name="Path">JSON path of the criteria field that sets the limit.</param>
/// <param name="Passed">True when met.</param>
/// <param name="Actual">The design's value with its unit, or "none in range".</param>
/// <param name="Limit">The limit with its unit.</param>
public sealed record CriterionReport(string Name, string Path, bool Passed, string Actual, string Limit);
