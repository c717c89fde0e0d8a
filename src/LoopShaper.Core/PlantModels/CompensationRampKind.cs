namespace LoopShaper.Core.PlantModels;

/// <summary>How the external compensation ramp Se of peak current mode is given.</summary>
public enum CompensationRampKind
{
    /// <summary>Se itself, in V/s at the comparator.</summary>
    VoltsPerSecond,

    /// <summary>Se as a multiple of the sensed off-time slope Sf (0.5 for the common Se = Sf / 2).</summary>
    MultipleOfOffSlope,

    /// <summary>The ramp factor mc = 1 + Se / Sn itself (1 for no ramp).</summary>
    Mc,
}
