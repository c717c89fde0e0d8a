namespace LoopShaper.Core.Synthesis;

/// <summary>What a part of a compensator network is.</summary>
public enum PartKind
{
    /// <summary>A resistor, value in ohms.</summary>
    Resistor,

    /// <summary>A capacitor, value in farads.</summary>
    Capacitor,
}
