using System.Collections.Immutable;
using LoopShaper.Core.Compensators;

namespace LoopShaper.Core.Synthesis;

/// <summary>The best set of neighbouring preferred values found by the search, for an op-amp or an OTA network.</summary>
/// <typeparam name="TNetwork">The kind of network searched (<see cref="OpAmpNetwork"/>, <see cref="TransconductanceNetwork"/>).</typeparam>
/// <param name="Network">The network with the chosen values.</param>
/// <param name="Parts">Its parts (ideal values as before, the chosen preferred values).</param>
/// <param name="Performance">Its loop figures from a full margin analysis.</param>
/// <param name="Distance">Its distance to the targets (see <see cref="SynthesisOptions.CrossoverScalePct"/>).</param>
/// <param name="SnappedDistance">The distance of the plainly snapped network, for comparison.</param>
/// <param name="CandidatesTried">Number of value combinations scored.</param>
public sealed record NeighbourSearchResult<TNetwork>(
    TNetwork Network,
    ImmutableArray<SynthesizedPart> Parts,
    LoopPerformance Performance,
    double Distance,
    double SnappedDistance,
    int CandidatesTried)
    where TNetwork : Compensator;
