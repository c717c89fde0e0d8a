namespace LoopShaper.Core.Compensators;

/// <summary>
/// The amplifier of a compensator: an ideal op-amp, a voltage-feedback op-amp with finite gain and bandwidth
/// (<see cref="OpAmp"/>), or a transconductance amplifier (<see cref="Transconductance"/>, with its own network to
/// ground, <see cref="TransconductanceNetwork"/>).
/// </summary>
public abstract record ErrorAmplifier;
