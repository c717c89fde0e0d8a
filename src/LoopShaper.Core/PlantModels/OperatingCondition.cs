namespace LoopShaper.Core.PlantModels;

/// <summary>Where the converter is operated for one analysis: an input voltage and a load current.</summary>
/// <param name="InputVoltageV">Input voltage, V.</param>
/// <param name="LoadCurrentA">Load current, A (zero for no load).</param>
public sealed record OperatingCondition(double InputVoltageV, double LoadCurrentA);
