namespace LoopShaper.Core.PlantModels;

/// <summary>
/// The peak current-mode quantities at one operating point (Ridley 1991; slopes in V/s at the comparator).
/// </summary>
/// <param name="DutyCycle">D at the operating point.</param>
/// <param name="IsDiscontinuous">True when the DCM duty-cycle law was used (no sampling double pole, no Qp).</param>
/// <param name="SenseGainOhm">Ri, V/A.</param>
/// <param name="OnSlopeVPerS">Sn = Ri vL,on / L, V/s.</param>
/// <param name="OffSlopeVPerS">Sf = Ri vL,off / L, V/s.</param>
/// <param name="RampSlopeVPerS">Se, the external ramp, V/s.</param>
/// <param name="Mc">mc = 1 + Se / Sn.</param>
/// <param name="ModulatorGainPerV">Fm = 1 / (mc Sn Ts), 1/V.</param>
/// <param name="FeedforwardGainKf">kf: input-voltage feedforward gain into the modulator, dimensionless (V at the comparator per V of input).</param>
/// <param name="OutputFeedbackGainKr">kr: output-voltage gain into the modulator, dimensionless (V at the comparator per V of output).</param>
/// <param name="SamplingPoleHz">fn = fs / 2: the natural frequency of the sampling gain He(s), Hz.</param>
/// <param name="DampingTerm">mc D' - 0.5: the current loop is stable (no subharmonic oscillation) when it is positive.</param>
/// <param name="Qp">Qp = 1 / (pi (mc D' - 0.5)); null in DCM or where mc D' - 0.5 &lt;= 0 (the current loop is unstable).</param>
/// <param name="SuggestedMcForUnityQp">mc that gives Qp = 1: (1/pi + 0.5) / D' (common practice: Qp near 1).</param>
/// <param name="SuggestedRampForUnityQpVPerS">The Se that gives Qp = 1, (mc - 1) Sn, V/s; zero when no ramp is needed (Qp &lt; 1 already without one).</param>
/// <param name="DelayS">Modulator delay, s: it delays the control voltage (vout / vc = Gvc e^(-s Td)), not the current loop.</param>
public sealed record PeakCurrentModeFigures(
    double DutyCycle,
    bool IsDiscontinuous,
    double SenseGainOhm,
    double OnSlopeVPerS,
    double OffSlopeVPerS,
    double RampSlopeVPerS,
    double Mc,
    double ModulatorGainPerV,
    double FeedforwardGainKf,
    double OutputFeedbackGainKr,
    double SamplingPoleHz,
    double DampingTerm,
    double? Qp,
    double SuggestedMcForUnityQp,
    double SuggestedRampForUnityQpVPerS,
    double DelayS)
{
    /// <summary>True in CCM when mc D' - 0.5 &lt;= 0: the sampled current loop is unstable and the converter oscillates at half the switching frequency.</summary>
    public bool IsSubharmonicallyUnstable => !IsDiscontinuous && DampingTerm <= 0;
}
