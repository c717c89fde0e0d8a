using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Loop;

/// <summary>
/// The closed-loop behaviour of a loop at one operating condition: output impedance and audio susceptibility open and
/// closed loop (Erickson and Maksimovic, 2nd ed., sec. 9.2: Zout,cl = Zout / (1 + T), Gvg,cl = Gvg / (1 + T)), and the
/// load-step, reference-step and line-step transients. Null parts are not available from the plant model (custom plants).
/// </summary>
/// <param name="OutputImpedanceOpen">|Zout| open loop, dB ohm (20 log10 of ohms), and its phase.</param>
/// <param name="OutputImpedanceClosed">|Zout / (1 + T)|, dB ohm, and its phase.</param>
/// <param name="AudioSusceptibilityOpen">|Gvg| open loop, dB, and its phase.</param>
/// <param name="AudioSusceptibilityClosed">|Gvg / (1 + T)|, dB, and its phase.</param>
/// <param name="LoadStep">Output deviation after the load step (vout = -Zout,cl iload).</param>
/// <param name="ReferenceStep">Output after the reference step.</param>
/// <param name="LineStep">Output deviation after the input step.</param>
/// <param name="PadeOrder">Order of the Pade approximation of a loop delay in the closed-loop functions; null without a delay.</param>
public sealed record ClosedLoopPerformance(
    FrequencyResponse? OutputImpedanceOpen,
    FrequencyResponse? OutputImpedanceClosed,
    FrequencyResponse? AudioSusceptibilityOpen,
    FrequencyResponse? AudioSusceptibilityClosed,
    Transient? LoadStep,
    Transient ReferenceStep,
    Transient? LineStep,
    int? PadeOrder);
