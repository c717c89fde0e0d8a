using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Loop;

/// <summary>Closed-loop output impedance, audio susceptibility and transients of a loop (<see cref="ClosedLoopPerformance"/>).</summary>
public static class ClosedLoopAnalyzer
{
    /// <summary>The closed-loop performance of a design at an operating condition (null: the design's own analysis condition).</summary>
    public static ClosedLoopPerformance Analyze(LoopDesign design, OperatingCondition? at = null, TransientSettings? transients = null)
    {
        var built = DesignAnalyzer.BuildLoop(design, at);
        var a = design.Analysis;
        transients ??= SettingsOf(design);
        double? vout = (design.Plant as BuckPlant)?.PowerStage.OutputVoltageV;
        double? vin = at?.InputVoltageV ?? (design.Plant is BuckPlant b ? DesignAnalyzer.ConditionOf(b.PowerStage, a).InputVoltageV : null);
        var grid = new FrequencyGrid(a.StartHz, a.StopHz, a.Points).LogSpaced();
        return Analyze(built.Loop, grid, transients, vout, vin);
    }

    /// <summary>The transient settings a design's analysis section asks for.</summary>
    public static TransientSettings SettingsOf(LoopDesign design) => new(
        LoadStepA: design.Analysis.LoadStepA,
        LoadSlewAPerS: design.Analysis.LoadStepSlewAPerS,
        ReferenceStepV: design.Analysis.ReferenceStepV,
        DurationS: design.Analysis.StepDurationS,
        Samples: design.Analysis.StepSamples);

    /// <summary>
    /// The closed-loop performance of a loop on a frequency grid. The crossover (for the default duration and the
    /// Pade order of a delay) is found by <see cref="MarginAnalyzer"/> over the grid's range.
    /// </summary>
    /// <param name="loop">The loop's blocks.</param>
    /// <param name="frequencyHz">Frequencies of the responses, Hz, ascending.</param>
    /// <param name="settings">Step sizes, slew rates and the recovery band.</param>
    /// <param name="outputVoltageV">The output voltage (for the default recovery band); null when unknown.</param>
    /// <param name="inputVoltageV">The input voltage (for the default line step); null when unknown.</param>
    public static ClosedLoopPerformance Analyze(LoopModel loop, IReadOnlyList<double> frequencyHz, TransientSettings settings, double? outputVoltageV = null, double? inputVoltageV = null)
    {
        var margins = MarginAnalyzer.Analyze(loop.LoopGain, frequencyHz[0], frequencyHz[^1]);
        double fc = margins.CrossoverHz ?? Math.Sqrt(frequencyHz[0] * frequencyHz[^1]);
        int? pade = loop.PadeOrder(fc);
        double duration = settings.DurationS ?? (20.0 / fc);
        double? band = settings.RecoveryBandV ?? (outputVoltageV is double v ? 0.01 * v : null);

        FrequencyResponse? zo = null, zc = null, ao = null, ac = null;
        Transient? load = null, line = null;
        if (loop.OutputImpedance is TransferFunction z && loop.ClosedOutputImpedance(pade) is TransferFunction zcl)
        {
            zo = FrequencyResponse.Of(z, frequencyHz);
            zc = FrequencyResponse.Of(zcl, frequencyHz);
            load = LoadStep(zcl, settings.LoadStepA, settings.LoadSlewAPerS, duration, settings.Samples, band);
        }

        if (loop.LineToOutput is TransferFunction g && loop.ClosedLineToOutput(pade) is TransferFunction gcl)
        {
            ao = FrequencyResponse.Of(g, frequencyHz);
            ac = FrequencyResponse.Of(gcl, frequencyHz);
            double step = settings.LineStepV ?? (inputVoltageV is double vin ? 0.1 * vin : 1.0);
            double rise = settings.LineSlewVPerS > 0 ? Math.Abs(step) / settings.LineSlewVPerS : 0.0;
            var r = StepSimulator.SimulateSlewed(gcl, rise, duration, settings.Samples, step);
            line = Transient.Of(r, step, rise, band);
        }

        var refStep = StepSimulator.Simulate(loop.ReferenceToOutput(pade), duration, settings.Samples, settings.ReferenceStepV);
        var reference = Transient.Of(refStep, settings.ReferenceStepV, 0.0, 0.02 * Math.Abs(refStep.Metrics.FinalValue ?? settings.ReferenceStepV));
        return new ClosedLoopPerformance(zo, zc, ao, ac, load, reference, line, pade);
    }

    /// <summary>
    /// The output deviation after a load step of size I ramped over I / slew: vout = -Zout,cl iload, simulated exactly
    /// (<see cref="StepSimulator.SimulateSlewed"/>).
    /// </summary>
    public static Transient LoadStep(TransferFunction closedOutputImpedance, double stepA, double slewAPerS, double durationS, int samples, double? bandV)
    {
        double rise = slewAPerS > 0 ? Math.Abs(stepA) / slewAPerS : 0.0;
        var r = StepSimulator.SimulateSlewed(closedOutputImpedance, rise, durationS, samples, -stepA);
        return Transient.Of(r, stepA, rise, bandV);
    }
}
