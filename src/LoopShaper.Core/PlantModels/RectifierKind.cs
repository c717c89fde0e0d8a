namespace LoopShaper.Core.PlantModels;

/// <summary>The low-side switch of the buck.</summary>
public enum RectifierKind
{
    /// <summary>A synchronous MOSFET, run in forced continuous conduction.</summary>
    Synchronous,

    /// <summary>A freewheeling diode: the converter enters DCM at light load.</summary>
    Diode,
}
