using System.Collections.Immutable;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.PlantModels;

/// <summary>The small-signal transfer functions of a power stage at one operating point.</summary>
/// <param name="ControlToOutput">Gvd(s) = vout / d, V per unit duty cycle (or vout / vc for current mode, modulator included).</param>
/// <param name="LineToOutput">Gvg(s) = vout / vin, with the outer voltage loop open (the current loop closed in current mode).</param>
/// <param name="OutputImpedance">Zout(s) = -vout / iload, with the outer voltage loop open, ohms.</param>
/// <param name="Derivations">How the poles and zeros were obtained.</param>
/// <param name="Model">Which small-signal model produced them.</param>
/// <param name="CurrentLoopGain">Ti(s), the inner current-loop gain (peak current mode in CCM); null otherwise.</param>
/// <param name="CurrentMode">The peak current-mode figures (slopes, mc, Qp ...); null in voltage mode.</param>
public sealed record BuckTransferFunctions(
    TransferFunction ControlToOutput,
    TransferFunction LineToOutput,
    TransferFunction OutputImpedance,
    ImmutableArray<Derivation> Derivations,
    SmallSignalModel Model = SmallSignalModel.VoltageModeContinuous,
    TransferFunction? CurrentLoopGain = null,
    PeakCurrentModeFigures? CurrentMode = null);
