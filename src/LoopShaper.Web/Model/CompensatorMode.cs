namespace LoopShaper.Web.Model;

/// <summary>How the compensator is entered.</summary>
public enum CompensatorMode
{
    /// <summary>By where its poles and zeros sit, and a gain setting.</summary>
    Placement,

    /// <summary>By the resistors and capacitors of the op-amp network.</summary>
    Parts,

    /// <summary>By the transconductance amplifier and its network to ground.</summary>
    Transconductance,
}
