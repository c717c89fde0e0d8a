using System.Collections.Immutable;

namespace LoopShaper.Core.PlantModels;

/// <summary>The power stage of a buck converter: what the schematic shows between the input and the load.</summary>
/// <param name="InputVoltage">Input voltage corners, V.</param>
/// <param name="OutputVoltageV">Regulated output voltage, V.</param>
/// <param name="LoadCurrent">Load current range, A.</param>
/// <param name="SwitchingFrequencyHz">Switching frequency, Hz.</param>
/// <param name="Inductor">Output inductor.</param>
/// <param name="OutputCapacitors">Output capacitor bank: one branch per kind of capacitor.</param>
/// <param name="HighSideOnResistanceOhm">High-side switch on-resistance, ohms.</param>
/// <param name="Rectifier">Low-side switch.</param>
/// <param name="MaxDutyCycle">Largest duty cycle the controller can give (minimum off-time), 0..1.</param>
public sealed record BuckPowerStage(
    VoltageRange InputVoltage,
    double OutputVoltageV,
    CurrentRange LoadCurrent,
    double SwitchingFrequencyHz,
    Inductor Inductor,
    ImmutableArray<CapacitorBranch> OutputCapacitors,
    double HighSideOnResistanceOhm,
    Rectifier Rectifier,
    double MaxDutyCycle = 0.95)
{
    /// <summary>Total output capacitance, F.</summary>
    public double TotalCapacitanceF => OutputCapacitors.Sum(c => c.TotalCapacitanceF);
}
