namespace LoopShaper.Core.PlantModels;

/// <summary>Input voltage at its three corners, volts.</summary>
/// <param name="MinV">Lowest input voltage.</param>
/// <param name="NominalV">Nominal input voltage.</param>
/// <param name="MaxV">Highest input voltage.</param>
public sealed record VoltageRange(double MinV, double NominalV, double MaxV);
