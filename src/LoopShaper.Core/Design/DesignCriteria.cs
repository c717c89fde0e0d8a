namespace LoopShaper.Core.Design;

/// <summary>
/// What the loop must achieve. Defaults are common practice, no source (shared/CONVENTIONS.md): phase margin at least
/// 45 degrees, gain margin at least 10 dB, crossover at most a fifth of the switching frequency, ripple current 20-40 %
/// of full load.
/// </summary>
/// <param name="MinPhaseMarginDeg">Smallest acceptable phase margin, degrees.</param>
/// <param name="MinGainMarginDb">Smallest acceptable upper gain margin, dB; a conditionally stable loop's lower gain margin must be at least as large in size (at most -MinGainMarginDb).</param>
/// <param name="MaxCrossoverFractionOfSwitching">Highest crossover as a fraction of the switching frequency.</param>
/// <param name="MinCrossoverHz">Lowest acceptable crossover, Hz (0 for none).</param>
/// <param name="MaxOvershootPct">Largest reference-step overshoot, %; null for no limit.</param>
/// <param name="MaxLoadStepDeviationV">Largest output deviation for the load step, V; null for no limit.</param>
/// <param name="MinRippleFraction">Lowest ripple current as a fraction of full load.</param>
/// <param name="MaxRippleFraction">Highest ripple current as a fraction of full load.</param>
public sealed record DesignCriteria(
    double MinPhaseMarginDeg = 45.0,
    double MinGainMarginDb = 10.0,
    double MaxCrossoverFractionOfSwitching = 0.2,
    double MinCrossoverHz = 0.0,
    double? MaxOvershootPct = null,
    double? MaxLoadStepDeviationV = null,
    double MinRippleFraction = 0.2,
    double MaxRippleFraction = 0.4);
