namespace LoopShaper.Core.Compensators;

/// <summary>A transconductance (OTA) error amplifier: output current gm (vref - vfb) into its output resistance Ro and the network to ground.</summary>
/// <param name="TransconductanceS">gm, siemens (A/V).</param>
/// <param name="OutputResistanceOhm">Ro, ohms.</param>
public sealed record Transconductance(double TransconductanceS, double OutputResistanceOhm) : ErrorAmplifier;
