namespace LoopShaper.Core.PlantModels;

/// <summary>Load current range, amperes; the minimum may be zero (no load).</summary>
/// <param name="MinA">Lightest load.</param>
/// <param name="MaxA">Full load.</param>
public sealed record CurrentRange(double MinA, double MaxA);
