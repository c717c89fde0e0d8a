using System.Collections.Immutable;

namespace LoopShaper.Core.Corners;

/// <summary>What a corner sweep computes.</summary>
/// <param name="Corners">The corners; null takes <see cref="CornerSet.Full"/> (36 corners).</param>
/// <param name="Tolerances">The tolerances; null takes the design's own, or the defaults.</param>
/// <param name="IncludeResponses">True to keep each corner's loop response for the overlaid Bode plot.</param>
/// <param name="IncludeLoadStep">True to simulate the load step at every corner (deviation and recovery time).</param>
/// <param name="MaxDegreeOfParallelism">Threads to use; null takes every core (Environment.ProcessorCount).</param>
public sealed record CornerSweepOptions(
    ImmutableArray<CornerPoint>? Corners = null,
    ToleranceSpec? Tolerances = null,
    bool IncludeResponses = true,
    bool IncludeLoadStep = true,
    int? MaxDegreeOfParallelism = null);
