namespace LoopShaper.Core.Synthesis;

/// <summary>The output network of a transconductance (OTA) Type II compensator: R2 in series with C1, C2 across both, to ground.</summary>
/// <param name="R2Ohm">Resistor in series with C1, ohms.</param>
/// <param name="C1F">Capacitor in series with R2, farads.</param>
/// <param name="C2F">Capacitor across R2 + C1, farads.</param>
public sealed record OtaTypeIIParts(double R2Ohm, double C1F, double C2F);
