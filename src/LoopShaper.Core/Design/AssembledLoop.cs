using System.Collections.Immutable;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Loop;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Design;

/// <summary>The loop of a design at one operating condition, and what went into it.</summary>
/// <param name="Loop">The loop's blocks.</param>
/// <param name="OperatingPoint">The operating point (power-stage plants only).</param>
/// <param name="Derivations">How the plant figures were obtained.</param>
/// <param name="Model">Which small-signal plant model was used.</param>
/// <param name="CurrentMode">Peak current-mode figures; null in voltage mode and for custom plants.</param>
/// <param name="CurrentLoopGain">Ti(s), the inner current-loop gain (peak current mode in CCM); null otherwise.</param>
/// <param name="IdealAmplifierCompensator">Gc with an ideal amplifier, when the design's amplifier is not ideal; null otherwise.</param>
public sealed record AssembledLoop(
    LoopModel Loop,
    OperatingPoint? OperatingPoint,
    ImmutableArray<Derivation> Derivations,
    SmallSignalModel Model,
    PeakCurrentModeFigures? CurrentMode,
    TransferFunction? CurrentLoopGain,
    TransferFunction? IdealAmplifierCompensator);
