namespace LoopShaper.Core.Design;

/// <summary>What to compute and where.</summary>
/// <param name="StartHz">Lowest analysed frequency, Hz.</param>
/// <param name="StopHz">Highest analysed frequency, Hz.</param>
/// <param name="Points">Points of the plotted responses.</param>
/// <param name="Input">Input-voltage corner of the main analysis.</param>
/// <param name="Load">Load corner of the main analysis.</param>
/// <param name="LoadStepA">Size of the load step for the transient, A.</param>
/// <param name="LoadStepSlewAPerS">Slew rate of the load step, A/s (default 10 A/us, common practice, no source); 0 for an ideal step.</param>
/// <param name="ReferenceStepV">Size of the reference step, V.</param>
/// <param name="StepDurationS">Simulated time of step responses, s; null picks 20 periods of the crossover frequency.</param>
/// <param name="StepSamples">Samples of each step response.</param>
/// <param name="ConductionModel">Which conduction-mode model to use (automatic by default).</param>
public sealed record AnalysisSettings(
    double StartHz = 10.0,
    double StopHz = 1e6,
    int Points = 1000,
    InputCorner Input = InputCorner.Nominal,
    LoadCorner Load = LoadCorner.Max,
    double LoadStepA = 1.0,
    double LoadStepSlewAPerS = 1e7,
    double ReferenceStepV = 0.01,
    double? StepDurationS = null,
    int StepSamples = 2000,
    ConductionModelChoice ConductionModel = ConductionModelChoice.Automatic);
