namespace LoopShaper.Web.Model.Charts;

/// <summary>Which responses the loop chart shows.</summary>
/// <param name="Plant">Control-to-output Fm Gvd.</param>
/// <param name="Compensator">Compensator Gc.</param>
/// <param name="Loop">Loop gain T.</param>
/// <param name="IdealAmplifier">Compensator and loop with an ideal amplifier, when the design has a real one.</param>
public sealed record BodeTraces(bool Plant = true, bool Compensator = true, bool Loop = true, bool IdealAmplifier = true);
