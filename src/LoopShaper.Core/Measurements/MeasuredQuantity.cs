namespace LoopShaper.Core.Measurements;

/// <summary>What a measured response is a measurement of.</summary>
public enum MeasuredQuantity
{
    /// <summary>The loop gain T, broken at the feedback node (shared/CONVENTIONS.md sign: the amplifier's inversion taken out).</summary>
    LoopGain,

    /// <summary>The plant: modulator times control-to-output (times the current-sense gain), the loop without the compensator.</summary>
    Plant,
}
