namespace LoopShaper.Core.Corners;

/// <summary>Which extreme every toleranced parameter takes at a corner.</summary>
public enum ToleranceSet
{
    /// <summary>Every parameter at its nominal factor (1, or the DC-bias factor of a derated capacitor).</summary>
    Nominal,

    /// <summary>Every parameter at its low extreme.</summary>
    AllLow,

    /// <summary>Every parameter at its high extreme.</summary>
    AllHigh,

    /// <summary>
    /// Each parameter at the extreme that lowers the phase margin at nominal input and load, chosen from the sign of a
    /// one-sided difference (the parameter alone moved to its high extreme): a linear-sensitivity estimate of the worst
    /// case, interactions between parameters are not searched.
    /// </summary>
    WorstCase,
}
