namespace LoopShaper.Core.Design;

/// <summary>Which input voltage an analysis uses.</summary>
public enum InputCorner
{
    /// <summary>Minimum input voltage.</summary>
    Min,

    /// <summary>Nominal input voltage.</summary>
    Nominal,

    /// <summary>Maximum input voltage.</summary>
    Max,
}
