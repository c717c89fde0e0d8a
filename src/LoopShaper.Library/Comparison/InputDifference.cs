namespace LoopShaper.Library.Comparison;

/// <summary>One design-file field whose value differs between two designs.</summary>
/// <param name="Path">The field's JSON path ("$.plant.powerStage.inductor.inductanceH"), as the validator names it.</param>
/// <param name="A">The value in design A as JSON text (numbers in SI base units); null when A has no such field.</param>
/// <param name="B">The value in design B; null when B has no such field.</param>
public sealed record InputDifference(string Path, string? A, string? B);
