namespace LoopShaper.Core.PlantModels;

/// <summary>The external compensation ramp of peak current mode: what is fixed and its value.</summary>
/// <param name="Kind">Se in V/s, a multiple of Sf, or mc.</param>
/// <param name="Value">V/s for VoltsPerSecond, a plain number for MultipleOfOffSlope and Mc.</param>
public sealed record CompensationRamp(CompensationRampKind Kind, double Value)
{
    /// <summary>No external ramp (mc = 1).</summary>
    public static CompensationRamp None { get; } = new(CompensationRampKind.VoltsPerSecond, 0.0);

    /// <summary>
    /// Se in V/s for the sensed slopes at an operating point: Se = Value, Value Sf, or (Value - 1) Sn
    /// (mc = 1 + Se / Sn, Ridley 1991).
    /// </summary>
    public double SlopeVPerS(double onSlopeVPerS, double offSlopeVPerS) => Kind switch
    {
        CompensationRampKind.VoltsPerSecond => Value,
        CompensationRampKind.MultipleOfOffSlope => Value * offSlopeVPerS,
        _ => (Value - 1.0) * onSlopeVPerS,
    };
}
