namespace LoopShaper.Core.PlantModels;

/// <summary>The output inductor.</summary>
/// <param name="InductanceH">Inductance in henries.</param>
/// <param name="DcrOhm">Winding (DC) resistance in ohms.</param>
public sealed record Inductor(double InductanceH, double DcrOhm);
