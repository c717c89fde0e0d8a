namespace LoopShaper.Core.Corners;

/// <summary>What a toleranced parameter of a design is.</summary>
public enum ToleranceKind
{
    /// <summary>The inductance L.</summary>
    Inductance,

    /// <summary>The capacitance of one output-capacitor branch (tolerance and DC-bias derating).</summary>
    Capacitance,

    /// <summary>The ESR of one output-capacitor branch (temperature multiplier).</summary>
    Esr,

    /// <summary>The inductor's DCR (temperature multiplier).</summary>
    Dcr,

    /// <summary>The current-sense gain Ri of peak current mode.</summary>
    SenseGain,

    /// <summary>The modulator ramp: Vm (or its feedforward k) in voltage mode, the compensation ramp Se (or mc - 1) in peak current mode.</summary>
    Ramp,

    /// <summary>The transconductance gm of an OTA error amplifier.</summary>
    Transconductance,

    /// <summary>One part of the compensator or the divider (R1 to R4, C1 to C3).</summary>
    CompensatorPart,
}
