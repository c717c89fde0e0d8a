namespace LoopShaper.Web.Model;

/// <summary>A compensator quantity the engineer moves on the chart or with a slider.</summary>
public enum PlacementTarget
{
    /// <summary>The gain setting (crossover target, integrator frequency or mid-band gain).</summary>
    Gain,

    /// <summary>First zero.</summary>
    Zero1,

    /// <summary>Second zero.</summary>
    Zero2,

    /// <summary>First pole.</summary>
    Pole1,

    /// <summary>Second pole.</summary>
    Pole2,
}
