namespace LoopShaper.Core.Synthesis;

/// <summary>How a starting placement of the compensator's poles and zeros is suggested.</summary>
public enum PlacementMethod
{
    /// <summary>Venable's K factor: the zeros and poles spread around the crossover to give the boost the phase margin needs (Type I, II or III).</summary>
    KFactor,

    /// <summary>Voltage mode: Type III with its double zero at the output LC resonance, a pole at the ESR zero and a pole at half the switching frequency.</summary>
    VoltageModeResonance,

    /// <summary>Peak current mode: Type II with its zero at the load pole and its pole at the ESR zero or half the switching frequency.</summary>
    CurrentModeResonance,
}
