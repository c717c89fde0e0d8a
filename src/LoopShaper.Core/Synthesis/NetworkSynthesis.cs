using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// The result of a component synthesis: the ideal network, every part snapped to its series, the loop analysed with
/// both, and optionally the best neighbouring values.
/// </summary>
public sealed record NetworkSynthesis
{
    /// <summary>The placement the parts realise, its gain as an integrator frequency.</summary>
    public required CompensatorPlacement Placement { get; init; }

    /// <summary>The network with the exact values (R1 as snapped).</summary>
    public required OpAmpNetwork IdealNetwork { get; init; }

    /// <summary>The network with every part at its nearest preferred value.</summary>
    public required OpAmpNetwork SnappedNetwork { get; init; }

    /// <summary>Every part: ideal value, nearest preferred value, error and tolerance.</summary>
    public required ImmutableArray<SynthesizedPart> Parts { get; init; }

    /// <summary>The loop with the ideal parts.</summary>
    public required LoopPerformance Ideal { get; init; }

    /// <summary>The loop with the snapped parts.</summary>
    public required LoopPerformance Snapped { get; init; }

    /// <summary>The search over neighbouring values, when it was asked for and found a stable loop.</summary>
    public NeighbourSearchResult<OpAmpNetwork>? Search { get; init; }

    /// <summary>Crossover the synthesis aims for, Hz.</summary>
    public required double TargetCrossoverHz { get; init; }

    /// <summary>Phase margin the synthesis aims for, degrees.</summary>
    public required double TargetPhaseMarginDeg { get; init; }

    /// <summary>Each value computed, with its formula and source.</summary>
    public required ImmutableArray<Derivation> Derivations { get; init; }

    /// <summary>Impractical values, pairings and missed targets, in words.</summary>
    public required ImmutableArray<string> Warnings { get; init; }

    /// <summary>The network to build: the search's when there is one, else the snapped one.</summary>
    public OpAmpNetwork ChosenNetwork => Search?.Network ?? SnappedNetwork;

    /// <summary>The parts to build.</summary>
    public ImmutableArray<SynthesizedPart> ChosenParts => Search?.Parts ?? Parts;

    /// <summary>The loop with the parts to build.</summary>
    public LoopPerformance Chosen => Search?.Performance ?? Snapped;

    /// <summary>The tolerance of every part to build, by designator (for the corner and Monte Carlo analyses).</summary>
    public ImmutableDictionary<string, PartTolerance> Tolerances => ChosenParts.ToImmutableDictionary(p => p.Designator, p => p.Tolerance);
}
