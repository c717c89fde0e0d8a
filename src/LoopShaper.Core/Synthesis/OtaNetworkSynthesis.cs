using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// The result of an OTA component synthesis: the ideal network (gm fixed), every part snapped to its series and the loop
/// analysed with both (with the amplifier's output resistance), and optionally the best neighbouring values.
/// </summary>
public sealed record OtaNetworkSynthesis
{
    /// <summary>The placement the parts realise with Ro infinite, its gain as an integrator frequency (from the divided output).</summary>
    public required CompensatorPlacement Placement { get; init; }

    /// <summary>The network with the exact values.</summary>
    public required TransconductanceNetwork IdealNetwork { get; init; }

    /// <summary>The network with every part at its nearest preferred value.</summary>
    public required TransconductanceNetwork SnappedNetwork { get; init; }

    /// <summary>Every part: ideal value, nearest preferred value, error and tolerance.</summary>
    public required ImmutableArray<SynthesizedPart> Parts { get; init; }

    /// <summary>The loop with the ideal parts.</summary>
    public required LoopPerformance Ideal { get; init; }

    /// <summary>The loop with the snapped parts.</summary>
    public required LoopPerformance Snapped { get; init; }

    /// <summary>The search over neighbouring values of R2, C1 and C2, when it was asked for and found a stable loop.</summary>
    public NeighbourSearchResult<TransconductanceNetwork>? Search { get; init; }

    /// <summary>Crossover the synthesis aims for, Hz.</summary>
    public required double TargetCrossoverHz { get; init; }

    /// <summary>Phase margin the synthesis aims for, degrees.</summary>
    public required double TargetPhaseMarginDeg { get; init; }

    /// <summary>Each value computed, with its formula and source.</summary>
    public required ImmutableArray<Derivation> Derivations { get; init; }

    /// <summary>Impractical values and missed targets, in words.</summary>
    public required ImmutableArray<string> Warnings { get; init; }

    /// <summary>The network to build: the search's when there is one, else the snapped one.</summary>
    public TransconductanceNetwork ChosenNetwork => Search?.Network ?? SnappedNetwork;

    /// <summary>The parts to build.</summary>
    public ImmutableArray<SynthesizedPart> ChosenParts => Search?.Parts ?? Parts;

    /// <summary>The loop with the parts to build.</summary>
    public LoopPerformance Chosen => Search?.Performance ?? Snapped;
}
