namespace LoopShaper.Core.Design;

/// <summary>Which conduction-mode model the analysis uses.</summary>
public enum ConductionModelChoice
{
    /// <summary>The model of the operating point's conduction mode: DCM when a diode rectifier stops conducting, CCM otherwise.</summary>
    Automatic,

    /// <summary>The CCM model even where the operating point is in DCM (to compare; the analysis warns).</summary>
    Continuous,

    /// <summary>The DCM model; only valid where the operating point is in DCM (a diode rectifier below the boundary load).</summary>
    Discontinuous,
}
