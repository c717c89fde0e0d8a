using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// An error-amplifier compensator: the transfer function from the output voltage to the control voltage, with the
/// amplifier's inversion taken out (shared/CONVENTIONS.md).
/// </summary>
/// <param name="Type">Type I, II or III.</param>
public abstract record Compensator(CompensatorType Type)
{
    /// <summary>
    /// The transfer function. A placement whose gain is set by a crossover target needs the rest of the loop:
    /// <paramref name="restOfLoop"/> is the loop gain without the compensator.
    /// </summary>
    public abstract TransferFunction TransferFunction(TransferFunction? restOfLoop = null);
}
