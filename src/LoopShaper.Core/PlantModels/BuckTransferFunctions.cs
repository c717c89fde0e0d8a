using System.Collections.Immutable;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.PlantModels;

/// <summary>The small-signal transfer functions of a power stage at one operating point.</summary>
/// <param name="ControlToOutput">Gvd(s) = vout / d, V per unit duty cycle (or vout / vc for current mode).</param>
/// <param name="LineToOutput">Gvg(s) = vout / vin, open loop.</param>
/// <param name="OutputImpedance">Zout(s) = -vout / iload, open loop, ohms.</param>
/// <param name="Derivations">How the poles and zeros were obtained.</param>
public sealed record BuckTransferFunctions(
    TransferFunction ControlToOutput,
    TransferFunction LineToOutput,
    TransferFunction OutputImpedance,
    ImmutableArray<Derivation> Derivations);
