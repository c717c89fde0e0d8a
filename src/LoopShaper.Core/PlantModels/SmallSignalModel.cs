namespace LoopShaper.Core.PlantModels;

/// <summary>Which small-signal plant model an analysis used.</summary>
public enum SmallSignalModel
{
    /// <summary>Voltage mode, continuous conduction: averaged CCM model (Erickson and Maksimovic, 2nd ed., sec. 7.2 and 8.2).</summary>
    VoltageModeContinuous,

    /// <summary>Voltage mode, discontinuous conduction: full-order averaged DCM model (Sun et al. 2001).</summary>
    VoltageModeDiscontinuous,

    /// <summary>Peak current mode, continuous conduction: Ridley 1991.</summary>
    PeakCurrentModeContinuous,

    /// <summary>Peak current mode, discontinuous conduction: full-order averaged DCM model with the peak-current duty-cycle law.</summary>
    PeakCurrentModeDiscontinuous,

    /// <summary>A custom plant entered by the engineer.</summary>
    Custom,
}
