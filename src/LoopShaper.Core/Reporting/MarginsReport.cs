using System.Collections.Immutable;

namespace LoopShaper.Core.Reporting;

/// <summary>Stability margins of the loop over the analysed range (shared/CONVENTIONS.md); null means "none in the analysed range".</summary>
/// <param name="StartHz">Lower end of the analysed range, Hz.</param>
/// <param name="StopHz">Upper end of the analysed range, Hz.</param>
/// <param name="CrossoverHz">Frequency of the gain crossover with the smallest phase margin, Hz.</param>
/// <param name="PhaseMarginDeg">Smallest phase margin over all gain crossovers, degrees.</param>
/// <param name="UpperGainMarginDb">Gain increase that destabilises, dB.</param>
/// <param name="UpperGainMarginHz">Where the upper gain margin is measured, Hz.</param>
/// <param name="LowerGainMarginDb">Gain reduction that destabilises (negative), dB; only for conditionally stable loops.</param>
/// <param name="LowerGainMarginHz">Where the lower gain margin is measured, Hz.</param>
/// <param name="DelayMarginS">Extra pure delay that destabilises, s.</param>
/// <param name="MultipleCrossovers">True when |T| crosses 0 dB more than once.</param>
/// <param name="ConditionallyStable">True when a gain reduction would destabilise the stable loop.</param>
/// <param name="OpenLoopRhpPoles">Open-loop poles in the right half plane.</param>
/// <param name="ClosedLoopStable">True when every closed-loop pole is in the left half plane.</param>
/// <param name="ClosedLoopPadeOrder">Order of the Pade approximation of a loop delay used for the closed-loop poles; null without a delay.</param>
/// <param name="GainCrossovers">Every gain crossover, ascending.</param>
/// <param name="PhaseCrossovers">Every phase crossover, ascending.</param>
/// <param name="Touches">Where |T| touches 0 dB without crossing.</param>
/// <param name="ClosedLoopPoles">Closed-loop poles over 2 pi, Hz.</param>
public sealed record MarginsReport(
    double? StartHz,
    double? StopHz,
    double? CrossoverHz,
    double? PhaseMarginDeg,
    double? UpperGainMarginDb,
    double? UpperGainMarginHz,
    double? LowerGainMarginDb,
    double? LowerGainMarginHz,
    double? DelayMarginS,
    bool MultipleCrossovers,
    bool ConditionallyStable,
    int OpenLoopRhpPoles,
    bool ClosedLoopStable,
    int? ClosedLoopPadeOrder,
    ImmutableArray<GainCrossoverReport> GainCrossovers,
    ImmutableArray<PhaseCrossoverReport> PhaseCrossovers,
    ImmutableArray<MagnitudeTouchReport> Touches,
    ImmutableArray<PoleReport> ClosedLoopPoles);
