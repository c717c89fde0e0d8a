namespace LoopShaper.Core.PlantModels;

/// <summary>Inductor current conduction mode at an operating point.</summary>
public enum ConductionMode
{
    /// <summary>Continuous conduction: the inductor current never reaches zero (or is forced negative by a synchronous rectifier).</summary>
    Continuous,

    /// <summary>Discontinuous conduction: a diode rectifier stops conducting before the end of the period.</summary>
    Discontinuous,
}
