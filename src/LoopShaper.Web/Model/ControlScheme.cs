namespace LoopShaper.Web.Model;

/// <summary>The modulator of a modelled buck, as chosen in the form.</summary>
public enum ControlScheme
{
    /// <summary>Voltage mode: a fixed or feedforward ramp.</summary>
    VoltageMode,

    /// <summary>Peak current mode after Ridley 1991: sensed inductor current plus a compensation ramp.</summary>
    PeakCurrentMode,
}
