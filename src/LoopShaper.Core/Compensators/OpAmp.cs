using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// A voltage-feedback op-amp with finite open-loop gain: A(s) = A0 / ((1 + s / wa)(1 + s / w2)), the dominant pole
/// fa = GBW / A0 (single-pole model, GBW the gain-bandwidth product) and an optional second pole f2
/// (Basso 2012, ch. 3, op-amp non-idealities).
/// </summary>
/// <param name="OpenLoopGain">A0, V/V (e.g. 1e5 for 100 dB).</param>
/// <param name="GainBandwidthHz">Gain-bandwidth product, Hz.</param>
/// <param name="SecondPoleHz">Second pole of the open-loop gain, Hz; null for the single-pole model.</param>
public sealed record OpAmp(double OpenLoopGain, double GainBandwidthHz, double? SecondPoleHz = null) : ErrorAmplifier
{
    /// <summary>The dominant pole fa = GBW / A0, Hz.</summary>
    public double DominantPoleHz => GainBandwidthHz / OpenLoopGain;

    /// <summary>A(s) as a transfer function.</summary>
    public TransferFunction OpenLoop()
        => TransferFunction.FromFactors(OpenLoopGain, 0, [], SecondPoleHz is double f2 ? [Factor.Real(DominantPoleHz), Factor.Real(f2)] : [Factor.Real(DominantPoleHz)]);
}
