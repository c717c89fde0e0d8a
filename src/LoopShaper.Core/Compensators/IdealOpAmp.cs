namespace LoopShaper.Core.Compensators;

/// <summary>An op-amp with infinite gain and bandwidth: Gc = Zf / Zin.</summary>
public sealed record IdealOpAmp : ErrorAmplifier
{
    /// <summary>The one ideal op-amp.</summary>
    public static IdealOpAmp Instance { get; } = new();
}
