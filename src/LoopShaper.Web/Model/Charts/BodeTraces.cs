namespace LoopShaper.Web.Model.Charts;

/// <summary>Which responses the loop chart shows.</summary>
/// <param name="Plant">Control-to-output Fm Gvd.</param>
/// <param name="Compensator">Compensator Gc.</param>
/// <param name="Loop">Loop gain T.</param>
public sealed record BodeTraces(bool Plant = true, bool Compensator = true, bool Loop = true);
