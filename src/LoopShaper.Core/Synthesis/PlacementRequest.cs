using LoopShaper.Core.Compensators;

namespace LoopShaper.Core.Synthesis;

/// <summary>What a suggested placement aims for.</summary>
/// <param name="Method">How to place the poles and zeros.</param>
/// <param name="CrossoverHz">Target loop crossover, Hz.</param>
/// <param name="PhaseMarginDeg">Target phase margin, degrees (the K factor meets it; the resonance methods report what they give).</param>
/// <param name="Type">Compensator type for the K factor; null picks it from the boost needed. Ignored by the resonance methods (Type III for voltage mode, Type II for current mode).</param>
/// <param name="SwitchingFrequencyHz">Switching frequency, Hz: needed by the resonance methods and for the crossover warning; null when unknown.</param>
public sealed record PlacementRequest(
    PlacementMethod Method,
    double CrossoverHz,
    double PhaseMarginDeg,
    CompensatorType? Type = null,
    double? SwitchingFrequencyHz = null);
