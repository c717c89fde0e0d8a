using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;

namespace LoopShaper.Core.Synthesis;

/// <summary>A suggested compensator placement and how it was reached.</summary>
/// <param name="Request">What was asked for.</param>
/// <param name="Placement">The placement, its gain as an integrator frequency that puts |T(j 2 pi fc)| = 1 at the target crossover.</param>
/// <param name="PlantPhaseDeg">Continuous phase of the plant Fm Gvd at the target crossover, degrees.</param>
/// <param name="RequiredBoostDeg">Boost the target phase margin needs: PM - 90 - plant phase, degrees.</param>
/// <param name="ProvidedBoostDeg">Boost the placement gives at the target crossover: 90 + phase of the compensator, degrees.</param>
/// <param name="ExpectedPhaseMarginDeg">180 + phase(T) at the target crossover, degrees.</param>
/// <param name="K">Venable's K factor used, or null for the resonance methods and Type I.</param>
/// <param name="Derivations">Each step with its formula, numbers and source.</param>
/// <param name="Warnings">Where the target cannot be met, in words.</param>
public sealed record PlacementSuggestion(
    PlacementRequest Request,
    CompensatorPlacement Placement,
    double PlantPhaseDeg,
    double RequiredBoostDeg,
    double ProvidedBoostDeg,
    double ExpectedPhaseMarginDeg,
    double? K,
    ImmutableArray<Derivation> Derivations,
    ImmutableArray<string> Warnings);
