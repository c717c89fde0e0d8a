using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Loop;

/// <summary>
/// The blocks around the feedback loop and the closed-loop functions built from them (shared/CONVENTIONS.md):
/// T(s) = Gc(s) Fm(s) Gvd(s) H, with the amplifier's inversion taken out. Closed loop after Erickson and Maksimovic,
/// 2nd ed., sec. 9.2: vout = vref (1/Hdiv) T/(1+T) + vin Gvg/(1+T) - iload Zout/(1+T).
/// </summary>
/// <param name="Compensator">Gc(s): output voltage to control voltage (an op-amp network's R1 is the divider's top resistor, so the divider is inside it).</param>
/// <param name="Modulator">Fm(s): control voltage to duty cycle, 1/Vm, with any modulator delay.</param>
/// <param name="ControlToOutput">Gvd(s): duty cycle to output voltage (or the custom plant with its modulator included, Fm = 1).</param>
/// <param name="SenseGain">H: gain from the output to the compensator's input, 1 for op-amp networks and placements.</param>
/// <param name="DividerRatio">Hdiv = Vref / Vout: scales the reference-to-output function.</param>
/// <param name="LineToOutput">Gvg(s), open loop, when the plant model gives it.</param>
/// <param name="OutputImpedance">Zout(s), open loop, when the plant model gives it.</param>
public sealed record LoopModel(
    TransferFunction Compensator,
    TransferFunction Modulator,
    TransferFunction ControlToOutput,
    double SenseGain,
    double DividerRatio,
    TransferFunction? LineToOutput,
    TransferFunction? OutputImpedance)
{
    /// <summary>The loop gain T(s).</summary>
    public TransferFunction LoopGain => Compensator.Multiply(Modulator).Multiply(ControlToOutput).Scale(SenseGain);

    /// <summary>Control voltage to output voltage, Fm Gvd: the "plant" the compensator sees.</summary>
    public TransferFunction Plant => Modulator.Multiply(ControlToOutput).Scale(SenseGain);

    /// <summary>Order of the Pade approximation used for a delay inside the loop, for closed-loop functions; null without a delay.</summary>
    public int? PadeOrder(double crossoverHz)
        => LoopGain.HasDelay ? PadeApproximation.SuggestOrder(LoopGain.DelayS, 2 * Math.PI * crossoverHz * 10) : null;

    /// <summary>X / (1 + T), a delay in the loop replaced by a Pade approximation of the given order.</summary>
    public TransferFunction ClosedLoop(TransferFunction x, int? padeOrder)
    {
        var t = LoopGain;
        if (t.HasDelay)
        {
            t = t.WithPadeDelay(padeOrder ?? 4);
        }

        var sensitivity = TransferFunction.Constant(1.0).Feedback(t);
        var xr = x.HasDelay ? x.WithPadeDelay(padeOrder ?? 4) : x;
        return xr.Multiply(sensitivity).Minimal();
    }

    /// <summary>Reference to output, (1/Hdiv) T / (1 + T).</summary>
    public TransferFunction ReferenceToOutput(int? padeOrder) => ClosedLoop(LoopGain.Scale(1.0 / DividerRatio), padeOrder);

    /// <summary>Closed-loop output impedance Zout / (1 + T); null when the plant model has no output impedance.</summary>
    public TransferFunction? ClosedOutputImpedance(int? padeOrder) => OutputImpedance is null ? null : ClosedLoop(OutputImpedance, padeOrder);

    /// <summary>Closed-loop line to output Gvg / (1 + T); null when the plant model has no line-to-output function.</summary>
    public TransferFunction? ClosedLineToOutput(int? padeOrder) => LineToOutput is null ? null : ClosedLoop(LineToOutput, padeOrder);
}
