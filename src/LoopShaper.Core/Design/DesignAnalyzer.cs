using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Loop;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Design;

/// <summary>The whole analysis of a design: validate, solve the operating point, build the loop, find the margins, simulate the steps, judge the criteria.</summary>
public static class DesignAnalyzer
{
    /// <summary>Voltage above which a design is flagged as hazardous: the ES1 limit of IEC 62368-1, 60 V DC.</summary>
    public const double HazardousVoltageV = 60.0;

    /// <summary>Stored energy above which a design is flagged: 20 J, the hazardous energy level of IEC 60950-1 (from memory).</summary>
    public const double HazardousEnergyJ = 20.0;

    /// <summary>Analyses a design. Never throws for bad input: errors come back in <see cref="DesignAnalysis.Issues"/>.</summary>
    public static DesignAnalysis Analyze(LoopDesign design)
    {
        var issues = DesignValidator.Validate(design).ToImmutableArray();
        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return new DesignAnalysis { Design = design, Issues = issues };
        }

        try
        {
            return AnalyzeValid(design, issues);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return new DesignAnalysis { Design = design, Issues = issues.Add(new ValidationIssue("design", "could not be analysed: " + ex.Message)) };
        }
    }

    /// <summary>The operating condition an analysis setting picks from the power stage.</summary>
    public static OperatingCondition ConditionOf(BuckPowerStage stage, AnalysisSettings settings) => new(
        settings.Input switch { InputCorner.Min => stage.InputVoltage.MinV, InputCorner.Max => stage.InputVoltage.MaxV, _ => stage.InputVoltage.NominalV },
        settings.Load == LoadCorner.Min ? stage.LoadCurrent.MinA : stage.LoadCurrent.MaxA);

    /// <summary>Builds the loop of a design at an operating condition (power-stage plants) and its operating point.</summary>
    public static (LoopModel Loop, OperatingPoint? OperatingPoint, ImmutableArray<Derivation> Derivations) BuildLoop(LoopDesign design, OperatingCondition? condition = null)
    {
        TransferFunction plant, modulator;
        TransferFunction? gvg = null, zout = null;
        double divider;
        OperatingPoint? op = null;
        var steps = new List<Derivation>();
        switch (design.Plant)
        {
            case BuckPlant buck:
                var at = condition ?? ConditionOf(buck.PowerStage, design.Analysis);
                op = BuckOperatingPoint.Solve(buck.PowerStage, at);
                var tfs = VoltageModeBuck.TransferFunctions(buck.PowerStage, op);
                double vm = buck.Control.RampAt(at.InputVoltageV);
                modulator = TransferFunction.Constant(1.0 / vm).WithDelay(buck.Control.ModulatorDelayS);
                plant = tfs.ControlToOutput;
                gvg = buck.Control.InputFeedforward
                    ? tfs.LineToOutput.Add(tfs.ControlToOutput.Scale(-op.DutyCycle / at.InputVoltageV))
                    : tfs.LineToOutput;
                zout = tfs.OutputImpedance;
                divider = buck.Feedback.Ratio;
                steps.AddRange(op.Derivations);
                steps.AddRange(tfs.Derivations);
                steps.Add(new Derivation("Modulator gain", "Fm = 1 / Vm", $"Fm = 1 / {Format(vm, "V")}", Format(1.0 / vm, "1/V"), "Erickson & Maksimovic, 2nd ed., sec. 7.3"));
                break;
            case CustomPlant custom:
                plant = custom.TransferFunction();
                modulator = TransferFunction.Constant(1.0);
                divider = custom.DividerRatio;
                steps.Add(new Derivation("Custom plant", "as entered", plant.ToString(), $"{plant.Poles.Length + Math.Max(-plant.OriginOrder, 0)} poles, {plant.Zeros.Length + Math.Max(plant.OriginOrder, 0)} zeros", "entered by the engineer"));
                break;
            default:
                throw new InvalidOperationException("Unknown plant kind.");
        }

        var rest = modulator.Multiply(plant);
        var gc = design.Compensator.TransferFunction(rest);
        var loop = new LoopModel(gc, modulator, plant, 1.0, divider, gvg, zout);
        return (loop, op, [.. steps]);
    }

    private static DesignAnalysis AnalyzeValid(LoopDesign design, ImmutableArray<ValidationIssue> issues)
    {
        var (loop, op, plantSteps) = BuildLoop(design);
        var a = design.Analysis;
        var placement = Resolve(design.Compensator, loop.Plant);
        var t = loop.LoopGain;
        var margins = MarginAnalyzer.Analyze(t, a.StartHz, a.StopHz);
        var grid = new FrequencyGrid(a.StartHz, a.StopHz, a.Points).LogSpaced();
        double fc = margins.CrossoverHz ?? Math.Sqrt(a.StartHz * a.StopHz);
        int? pade = loop.PadeOrder(fc);
        double duration = a.StepDurationS ?? (20.0 / fc);

        var refTf = loop.ReferenceToOutput(pade);
        var refStep = Simulate(refTf, duration, a.StepSamples, a.ReferenceStepV, pade);
        StepResponse? loadStep = null;
        if (loop.ClosedOutputImpedance(pade) is TransferFunction zcl)
        {
            // A load step of +I draws current from the output: vout = -Zout_cl I.
            double rise = a.LoadStepSlewAPerS > 0 ? a.LoadStepA / a.LoadStepSlewAPerS : 0.0;
            var ls = StepSimulator.SimulateSlewed(zcl, rise, duration, a.StepSamples, -a.LoadStepA);
            loadStep = pade is null ? ls : ls with { Delay = DelayTreatment.Pade, PadeOrder = pade };
        }

        var plantResponse = FrequencyResponse.Of(loop.Plant, grid);
        var compResponse = FrequencyResponse.Of(loop.Compensator, grid);
        var steps = new List<Derivation>(plantSteps);
        steps.AddRange(CompensatorDerivations(design.Compensator, placement));
        steps.AddRange(MarginDerivations(margins));

        var warnings = Warnings(design, op, margins);
        var criteria = Criteria(design, op, margins, refStep, loadStep);
        return new DesignAnalysis
        {
            Design = design,
            Issues = issues,
            OperatingPoint = op,
            Loop = loop,
            ResolvedPlacement = placement,
            Margins = margins,
            PlantResponse = plantResponse,
            CompensatorResponse = compResponse,
            LoopResponse = plantResponse.Times(compResponse),
            ReferenceStep = refStep,
            LoadStep = loadStep,
            Criteria = criteria,
            Warnings = warnings,
            Derivations = [.. steps],
        };
    }

    private static StepResponse Simulate(TransferFunction h, double duration, int samples, double amplitude, int? pade)
    {
        var r = StepSimulator.Simulate(h, duration, samples, amplitude);
        return pade is null ? r : r with { Delay = DelayTreatment.Pade, PadeOrder = pade };
    }

    /// <summary>The compensator as a placement with its gain as an integrator frequency.</summary>
    public static CompensatorPlacement Resolve(Compensator compensator, TransferFunction plant) => compensator switch
    {
        OpAmpNetwork n => n.ToPlacement(),
        CompensatorPlacement p => p with { Gain = new GainSetting(GainSettingKind.IntegratorHz, p.IntegratorHz(plant)) },
        _ => throw new InvalidOperationException("Unknown compensator kind."),
    };

    private static IEnumerable<Derivation> CompensatorDerivations(Compensator compensator, CompensatorPlacement placement)
    {
        const string src = "Venable 1983; Basso 2012, ch. 3 (op-amp Type I/II/III networks)";
        if (compensator is OpAmpNetwork n)
        {
            yield return new("Integrator frequency", "fi = 1 / (2 pi R1 (C1 + C2))", $"fi = 1 / (2 pi x {Format(n.R1Ohm, "Ohm")} x ({Format(n.C1F, "F")} + {Format(n.C2F, "F")}))", Format(placement.Gain.Value, "Hz"), src);
            if (n.Type != CompensatorType.TypeI)
            {
                yield return new("First zero", "fz1 = 1 / (2 pi R2 C1)", $"fz1 = 1 / (2 pi x {Format(n.R2Ohm, "Ohm")} x {Format(n.C1F, "F")})", Format(placement.Zero1Hz!.Value, "Hz"), src);
                yield return new("First pole", "fp1 = (C1 + C2) / (2 pi R2 C1 C2)", $"fp1 = ({Format(n.C1F, "F")} + {Format(n.C2F, "F")}) / (2 pi x {Format(n.R2Ohm, "Ohm")} x {Format(n.C1F, "F")} x {Format(n.C2F, "F")})", Format(placement.Pole1Hz!.Value, "Hz"), src);
            }

            if (n.Type == CompensatorType.TypeIII)
            {
                yield return new("Second zero", "fz2 = 1 / (2 pi (R1 + R3) C3)", $"fz2 = 1 / (2 pi x ({Format(n.R1Ohm, "Ohm")} + {Format(n.R3Ohm, "Ohm")}) x {Format(n.C3F, "F")})", Format(placement.Zero2Hz!.Value, "Hz"), src);
                yield return new("Second pole", "fp2 = 1 / (2 pi R3 C3)", $"fp2 = 1 / (2 pi x {Format(n.R3Ohm, "Ohm")} x {Format(n.C3F, "F")})", Format(placement.Pole2Hz!.Value, "Hz"), src);
            }
        }
        else if (compensator is CompensatorPlacement p && p.Gain.Kind == GainSettingKind.CrossoverHz)
        {
            yield return new("Integrator frequency from the crossover target", "fi = 1 / (2 pi |Gc1(j wc) Fm Gvd(j wc)|), Gc1 the compensator with wi = 1", $"fc = {Format(p.Gain.Value, "Hz")}", Format(placement.Gain.Value, "Hz"), "definition of the crossover |T(j wc)| = 1");
        }
        else if (compensator is CompensatorPlacement m && m.Gain.Kind == GainSettingKind.MidbandGainDb)
        {
            yield return new("Integrator frequency from the mid-band gain", "fi = 10^(G/20) fz1", $"fi = 10^({m.Gain.Value.ToString("G4", CultureInfo.InvariantCulture)}/20) x {Format(m.Zero1Hz ?? 0, "Hz")}", Format(placement.Gain.Value, "Hz"), "asymptote of (wi/s)(1 + s/wz1) above wz1");
        }

        yield return new("Compensator transfer function", "Gc(s) = (wi/s) prod(1 + s/wz) / prod(1 + s/wp)", placement.ToString(), "", "Erickson & Maksimovic, 2nd ed., sec. 9.5");
    }

    private static IEnumerable<Derivation> MarginDerivations(StabilityMargins m)
    {
        const string src = "shared conventions: margins against -180 degrees (Bavafi-Toosi 2019, ch. 10)";
        foreach (var g in m.GainCrossovers)
        {
            yield return new("Phase margin", "PM = 180 + phase(T(j 2 pi fc)), |T(j 2 pi fc)| = 1 solved by Brent's method", $"PM = 180 + ({g.PhaseDeg.ToString("F2", CultureInfo.InvariantCulture)}) at fc = {Format(g.FrequencyHz, "Hz")}", g.PhaseMarginDeg.ToString("F2", CultureInfo.InvariantCulture) + " deg", src);
        }

        foreach (var p in m.PhaseCrossovers)
        {
            yield return new("Gain margin", "GM = -20 log10 |T(j 2 pi f180)|, phase(T) = -180 + k 360", $"GM = -({p.MagnitudeDb.ToString("F2", CultureInfo.InvariantCulture)} dB) at f = {Format(p.FrequencyHz, "Hz")} (phase {p.CriticalPhaseDeg.ToString("F0", CultureInfo.InvariantCulture)} deg)", p.GainMarginDb.ToString("F2", CultureInfo.InvariantCulture) + " dB", src);
        }

        if (m.DelayMarginS is double dm)
        {
            yield return new("Delay margin", "Td,max = min PM / (2 pi fc) over the crossovers (PM in radians)", "", Format(dm, "s"), "definition, e.g. Astrom & Murray, Feedback Systems, sec. 10.3 (from memory)");
        }

        yield return new("Closed-loop stability", "roots of 1 + T(s) = 0 (numerator + denominator polynomial)", string.Join(", ", m.ClosedLoopPoles.Select(p => string.Create(CultureInfo.InvariantCulture, $"{p.Real / (2 * Math.PI):G4}{(p.Imaginary >= 0 ? "+" : "-")}j{Math.Abs(p.Imaginary) / (2 * Math.PI):G4} Hz"))),
            m.IsClosedLoopStable ? "stable: every pole in the left half plane" : "UNSTABLE: a pole in the right half plane or on the axis", "closed-loop characteristic equation");
    }

    private static ImmutableArray<string> Warnings(LoopDesign design, OperatingPoint? op, StabilityMargins m)
    {
        var w = new List<string>();
        var inv = CultureInfo.InvariantCulture;
        double? fs = design.Plant switch
        {
            BuckPlant b => b.PowerStage.SwitchingFrequencyHz,
            CustomPlant c => c.SwitchingFrequencyHz,
            _ => null,
        };
        if (design.Plant is BuckPlant buck)
        {
            var s = buck.PowerStage;
            if (s.InputVoltage.MaxV > HazardousVoltageV || s.OutputVoltageV > HazardousVoltageV)
            {
                w.Add($"HAZARDOUS VOLTAGE: the design has {Format(Math.Max(s.InputVoltage.MaxV, s.OutputVoltageV), "V")}, above the {HazardousVoltageV} V DC limit of IEC 62368-1 class ES1. Work on it needs the precautions of your local codes and a qualified person.");
            }

            double energy = 0.5 * s.TotalCapacitanceF * s.OutputVoltageV * s.OutputVoltageV;
            if (energy > HazardousEnergyJ)
            {
                w.Add(string.Create(inv, $"LARGE STORED ENERGY: the output capacitors hold {energy:F1} J at {Format(s.OutputVoltageV, "V")}, above {HazardousEnergyJ} J. Discharge them before handling."));
            }

            if (s.OutputVoltageV * s.LoadCurrent.MaxA > 240)
            {
                w.Add($"HIGH AVAILABLE POWER: {Format(s.OutputVoltageV * s.LoadCurrent.MaxA, "W")} at the output, above 240 VA (the hazardous energy level of IEC 60950-1, from memory): a short circuit can burn.");
            }

            if (s.Rectifier.Kind == RectifierKind.Diode)
            {
                var light = BuckOperatingPoint.Solve(s, new OperatingCondition(s.InputVoltage.MaxV, s.LoadCurrent.MinA));
                if (light.Mode == ConductionMode.Discontinuous)
                {
                    w.Add($"DCM: with the diode rectifier the converter enters discontinuous conduction below {Format(light.BoundaryLoadCurrentA, "A")} load (at the maximum input); the CCM model used here does not hold there.");
                }
            }

            if (op is not null && op.Mode == ConductionMode.Discontinuous)
            {
                w.Add("DCM at the analysed operating point: the CCM small-signal model is not valid here.");
            }
        }

        if (fs is double f && m.CrossoverHz is double fc && fc > f / 5)
        {
            w.Add(string.Create(inv, $"The crossover {Format(fc, "Hz")} is above a fifth of the switching frequency ({Format(f / 5, "Hz")}): the averaged model loses accuracy and sampling effects erode the phase margin."));
        }

        if (m.PhaseMarginDeg is double pm && pm < design.Criteria.MinPhaseMarginDeg)
        {
            w.Add(string.Create(inv, $"Low phase margin: {pm:F1} deg."));
        }

        if (m.UpperGainMarginDb is double gm && gm < design.Criteria.MinGainMarginDb)
        {
            w.Add(string.Create(inv, $"Low gain margin: {gm:F1} dB."));
        }

        if (!m.IsClosedLoopStable)
        {
            w.Add("The closed loop is UNSTABLE.");
        }

        w.AddRange(m.Notes);
        return [.. w];
    }

    private static ImmutableArray<CriterionResult> Criteria(LoopDesign design, OperatingPoint? op, StabilityMargins m, StepResponse refStep, StepResponse? loadStep)
    {
        var k = design.Criteria;
        var inv = CultureInfo.InvariantCulture;
        var r = new List<CriterionResult>
        {
            new("closed-loop stability", "criteria", m.IsClosedLoopStable, m.IsClosedLoopStable ? "stable" : "unstable", "stable"),
            new("phase margin", "criteria.minPhaseMarginDeg", m.PhaseMarginDeg >= k.MinPhaseMarginDeg,
                m.PhaseMarginDeg is double pm ? pm.ToString("F1", inv) + " deg" : "no crossover in range", ">= " + k.MinPhaseMarginDeg.ToString("G4", inv) + " deg"),
            new("gain margin", "criteria.minGainMarginDb", m.UpperGainMarginDb is null || m.UpperGainMarginDb >= k.MinGainMarginDb,
                m.UpperGainMarginDb is double gm ? gm.ToString("F1", inv) + " dB" : "no phase crossover in range", ">= " + k.MinGainMarginDb.ToString("G4", inv) + " dB"),
        };
        double? fs = design.Plant switch { BuckPlant b => b.PowerStage.SwitchingFrequencyHz, CustomPlant c => c.SwitchingFrequencyHz, _ => null };
        if (fs is double f && m.CrossoverHz is double fc)
        {
            r.Add(new("crossover vs switching frequency", "criteria.maxCrossoverFractionOfSwitching", fc <= k.MaxCrossoverFractionOfSwitching * f,
                Format(fc, "Hz"), "<= " + Format(k.MaxCrossoverFractionOfSwitching * f, "Hz")));
        }

        if (k.MinCrossoverHz > 0)
        {
            r.Add(new("minimum crossover", "criteria.minCrossoverHz", m.CrossoverHz >= k.MinCrossoverHz, m.CrossoverHz is double c ? Format(c, "Hz") : "none", ">= " + Format(k.MinCrossoverHz, "Hz")));
        }

        if (k.MaxOvershootPct is double os)
        {
            var o = refStep.Metrics.OvershootPct;
            r.Add(new("reference-step overshoot", "criteria.maxOvershootPct", o <= os, o is double ov ? ov.ToString("F1", inv) + " %" : "n/a", "<= " + os.ToString("G4", inv) + " %"));
        }

        if (k.MaxLoadStepDeviationV is double dv && loadStep is not null)
        {
            double peak = Math.Abs(loadStep.Metrics.PeakDeviation);
            r.Add(new("load-step deviation", "criteria.maxLoadStepDeviationV", peak <= dv, Format(peak, "V"), "<= " + Format(dv, "V")));
        }

        if (op is not null && design.Plant is BuckPlant bp)
        {
            double frac = op.RippleCurrentApp / bp.PowerStage.LoadCurrent.MaxA;
            r.Add(new("ripple current / full load", "criteria.minRippleFraction", frac >= k.MinRippleFraction && frac <= k.MaxRippleFraction,
                (100 * frac).ToString("F0", inv) + " %", (100 * k.MinRippleFraction).ToString("F0", inv) + "-" + (100 * k.MaxRippleFraction).ToString("F0", inv) + " %"));
        }

        return [.. r];
    }
}
