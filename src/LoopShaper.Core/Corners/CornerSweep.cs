using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Loop;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>
/// The corner table of a design: every corner analysed in full (operating point, model, loop, margins by
/// <see cref="MarginAnalyzer"/>, load step by <see cref="ClosedLoopAnalyzer.LoadStep"/>), the corners spread over every
/// core. A placement whose gain is a crossover target is resolved once at the main operating point: the compensator is
/// the same hardware at every corner. Custom plants have no input or load range: their corners are the tolerance sets.
/// </summary>
public static class CornerSweep
{
    /// <summary>Analyses the corners. Never throws for a corner that cannot be analysed: its row says why.</summary>
    public static CornerTable Run(LoopDesign design, CornerSweepOptions? options = null, CancellationToken cancellation = default)
    {
        options ??= new CornerSweepOptions();
        design = Fixed(design);
        var parameters = ToleranceModel.Parameters(design, options.Tolerances);
        var corners = options.Corners ?? CornerSet.Full;
        if (design.Plant is not BuckPlant)
        {
            corners = [.. corners.Select(c => c with { Input = InputCorner.Nominal, Load = LoadCorner.Nominal }).Distinct()];
        }

        var worstFactors = corners.Any(c => c.Tolerances == ToleranceSet.WorstCase) ? WorstCaseFactors(design, parameters, options, cancellation) : ToleranceModel.Factors(parameters, ToleranceSet.Nominal);
        var grid = new FrequencyGrid(design.Analysis.StartHz, design.Analysis.StopHz, design.Analysis.Points).LogSpaced();
        var rows = new CornerRow[corners.Length];
        var po = new ParallelOptions { MaxDegreeOfParallelism = options.MaxDegreeOfParallelism ?? Environment.ProcessorCount, CancellationToken = cancellation };
        Parallel.For(0, corners.Length, po, i =>
        {
            var c = corners[i];
            double[] factors = c.Tolerances == ToleranceSet.WorstCase ? worstFactors : ToleranceModel.Factors(parameters, c.Tolerances);
            rows[i] = Row(design, parameters, c, factors, grid, options);
        });
        return new CornerTable(parameters, [.. worstFactors], [.. rows], WorstOf(rows));
    }

    /// <summary>The design with a crossover-target placement resolved at its main operating point (the same compensator at every corner).</summary>
    public static LoopDesign Fixed(LoopDesign design)
        => design.Compensator is CompensatorPlacement { Gain.Kind: GainSettingKind.CrossoverHz } target
            ? design with { Compensator = DesignAnalyzer.Resolve(target, DesignAnalyzer.BuildLoop(design).Loop.Plant) }
            : design;

    /// <summary>The operating condition of an input and load corner.</summary>
    public static OperatingCondition? ConditionOf(LoopDesign design, CornerPoint corner)
        => design.Plant is BuckPlant b ? DesignAnalyzer.ConditionOf(b.PowerStage, new AnalysisSettings(Input: corner.Input, Load: corner.Load)) : null;

    /// <summary>Analyses one corner of a design (a crossover target already resolved, see <see cref="Fixed"/>).</summary>
    public static CornerRow Row(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, CornerPoint corner, IReadOnlyList<double> factors, IReadOnlyList<double> gridHz, CornerSweepOptions options)
    {
        var at = ConditionOf(design, corner);
        var d = ToleranceModel.Apply(design, parameters, factors);
        var cond = at ?? new OperatingCondition(0, 0);
        ImmutableArray<double> fs = [.. factors];
        ConductionMode? mode = null;
        double? duty = null;
        if (d.Plant is BuckPlant buck && at is not null)
        {
            var physical = BuckOperatingPoint.Solve(buck.PowerStage, at);
            mode = physical.Mode;
            duty = physical.DutyCycle;
            if (physical.Mode == ConductionMode.Discontinuous && at.LoadCurrentA <= 0 && d.Analysis.ConductionModel != ConductionModelChoice.Continuous)
            {
                return NotAnalysed("no load with a diode rectifier: the converter skips pulses and no averaged model holds");
            }

            if (d.Analysis.ConductionModel == ConductionModelChoice.Discontinuous && physical.Mode == ConductionMode.Continuous)
            {
                return NotAnalysed("CCM here: the forced DCM model does not apply");
            }
        }

        try
        {
            var built = DesignAnalyzer.BuildLoop(d, at);
            var a = d.Analysis;
            var t = built.Loop.LoopGain;
            var m = MarginAnalyzer.Analyze(t, a.StartHz, a.StopHz);
            var figures = LoopFigures.From(m);
            double? dev = null, rec = null;
            if (options.IncludeLoadStep && m.IsClosedLoopStable)
            {
                double fc = m.CrossoverHz ?? Math.Sqrt(a.StartHz * a.StopHz);
                int? pade = built.Loop.PadeOrder(fc);
                if (built.Loop.ClosedOutputImpedance(pade) is { } zcl)
                {
                    double? band = d.Plant is BuckPlant bp ? 0.01 * bp.PowerStage.OutputVoltageV : null;
                    var step = ClosedLoopAnalyzer.LoadStep(zcl, a.LoadStepA, a.LoadStepSlewAPerS, a.StepDurationS ?? (20.0 / fc), a.StepSamples, band);
                    dev = step.PeakDeviationV;
                    rec = step.RecoveryTimeS;
                }
            }

            var response = options.IncludeResponses ? FrequencyResponse.Of(t, gridHz) : null;
            double? fsw = d.Plant switch { BuckPlant b => b.PowerStage.SwitchingFrequencyHz, CustomPlant c => c.SwitchingFrequencyHz, _ => null };
            string? note = built.CurrentMode is { IsSubharmonicallyUnstable: true } ? "subharmonic oscillation: the current loop is unstable here" : null;
            return new CornerRow(corner, cond, fs, mode, built.Model, built.OperatingPoint?.DutyCycle ?? duty, figures, dev, rec, response, CornerVerdict.Failures(figures, d.Criteria, fsw, dev), note);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return NotAnalysed("not analysed: " + ex.Message);
        }

        CornerRow NotAnalysed(string why) => new(corner, cond, fs, mode, null, duty, null, null, null, null, [why], why);
    }

    /// <summary>
    /// The sensitivity-directed worst case: at nominal input and load, each parameter alone is moved to its high extreme;
    /// where that lowers the phase margin the worst case takes the high extreme, otherwise the low one.
    /// </summary>
    public static double[] WorstCaseFactors(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, CornerSweepOptions? options = null, CancellationToken cancellation = default)
    {
        var nominal = ToleranceModel.Factors(parameters, ToleranceSet.Nominal);
        var at = design.Plant is BuckPlant ? ConditionOf(design, new CornerPoint(InputCorner.Nominal, LoadCorner.Nominal, ToleranceSet.Nominal)) : null;
        double? basePm = PhaseMargin(design, parameters, nominal, at);
        var worst = new double[parameters.Length];
        var po = new ParallelOptions { MaxDegreeOfParallelism = options?.MaxDegreeOfParallelism ?? Environment.ProcessorCount, CancellationToken = cancellation };
        Parallel.For(0, parameters.Length, po, i =>
        {
            var f = (double[])nominal.Clone();
            f[i] = parameters[i].HighFactor;
            double? pm = PhaseMargin(design, parameters, f, at);
            worst[i] = basePm is double b && pm is double h && h < b ? parameters[i].HighFactor : parameters[i].LowFactor;
        });
        return worst;
    }

    private static double? PhaseMargin(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, double[] factors, OperatingCondition? at)
    {
        try
        {
            var d = ToleranceModel.Apply(design, parameters, factors);
            return MarginAnalyzer.Analyze(DesignAnalyzer.BuildLoop(d, at).Loop.LoopGain, d.Analysis.StartHz, d.Analysis.StopHz).PhaseMarginDeg;
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return null;
        }
    }

    /// <summary>The worst row for each figure.</summary>
    public static CornerWorst WorstOf(IReadOnlyList<CornerRow> rows)
    {
        int? Pick(Func<CornerRow, double?> figure, bool largest)
        {
            int? best = null;
            double bv = 0;
            for (int i = 0; i < rows.Count; i++)
            {
                if (figure(rows[i]) is double v && (best is null || (largest ? v > bv : v < bv)))
                {
                    (best, bv) = (i, v);
                }
            }

            return best;
        }

        int? recovery = null;
        for (int i = 0; i < rows.Count; i++)
        {
            if (rows[i].LoadStepDeviationV is not null && rows[i].RecoveryTimeS is null)
            {
                recovery = i;
                break;
            }
        }

        recovery ??= Pick(r => r.RecoveryTimeS, true);
        return new CornerWorst(
            Pick(r => r.Figures?.CrossoverHz, true),
            Pick(r => r.Figures?.CrossoverHz, false),
            Pick(r => r.Figures?.PhaseMarginDeg, false),
            Pick(r => r.Figures?.UpperGainMarginDb, false),
            Pick(r => r.Figures?.LowerGainMarginDb, true),
            Pick(r => r.LoadStepDeviationV is double v ? Math.Abs(v) : null, true),
            recovery);
    }
}
