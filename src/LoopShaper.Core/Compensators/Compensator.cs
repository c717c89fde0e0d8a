using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// An error-amplifier compensator: the transfer function from its input voltage to the control voltage, with the
/// amplifier's inversion taken out (shared/CONVENTIONS.md). Op-amp networks and placements take the output voltage
/// (the divider's top resistor is the op-amp network's R1); a transconductance network takes the divided output.
/// </summary>
/// <param name="Type">Type I, II or III.</param>
public abstract record Compensator(CompensatorType Type)
{
    /// <summary>
    /// The transfer function. A placement whose gain is set by a crossover target needs the rest of the loop:
    /// <paramref name="restOfLoop"/> is the loop gain without the compensator.
    /// </summary>
    public abstract TransferFunction TransferFunction(TransferFunction? restOfLoop = null);

    /// <summary>The transfer function with an ideal amplifier (the same as <see cref="TransferFunction"/> when the amplifier is ideal).</summary>
    public virtual TransferFunction IdealTransferFunction(TransferFunction? restOfLoop = null) => TransferFunction(restOfLoop);

    /// <summary>True when the amplifier is ideal (infinite gain and bandwidth, or infinite output resistance).</summary>
    public virtual bool HasIdealAmplifier => true;

    /// <summary>True when the compensator's input is the divided output Hdiv vout (a transconductance amplifier), so the loop carries H = Hdiv.</summary>
    public virtual bool TakesDividedOutput => false;
}
