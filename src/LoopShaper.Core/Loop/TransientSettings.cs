namespace LoopShaper.Core.Loop;

/// <summary>The closed-loop transients to simulate: sizes, slew rates and the recovery band.</summary>
/// <param name="LoadStepA">Load step, A (positive: more load).</param>
/// <param name="LoadSlewAPerS">Load-step slew rate, A/s; 0 for an ideal step.</param>
/// <param name="RecoveryBandV">Half-width of the band the output must return to and stay within, V; null takes 1 % of the output voltage (common practice, no source), or 2 % of the peak deviation when the output voltage is unknown.</param>
/// <param name="ReferenceStepV">Reference step at the output (the reference step times 1 / Hdiv is the output's final change), V.</param>
/// <param name="LineStepV">Input-voltage step, V; null takes 10 % of the nominal input (common practice, no source).</param>
/// <param name="LineSlewVPerS">Input-step slew rate, V/s; 0 for an ideal step.</param>
/// <param name="DurationS">Simulated time, s; null takes 20 periods of the crossover frequency.</param>
/// <param name="Samples">Samples of each transient, 2 or more.</param>
public sealed record TransientSettings(
    double LoadStepA = 1.0,
    double LoadSlewAPerS = 1e7,
    double? RecoveryBandV = null,
    double ReferenceStepV = 0.01,
    double? LineStepV = null,
    double LineSlewVPerS = 0.0,
    double? DurationS = null,
    int Samples = 2000);
