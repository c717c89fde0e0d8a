using LoopShaper.Core.Compensators;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Validation;

/// <summary>
/// Checks every input of a design. Field names are the design file's JSON paths (docs/design-file.md) so that the
/// command line, the web form and the file loader point at the same place. Ranges are generous physical limits
/// (our choice, no source) meant to catch typing errors, not to judge the design.
/// </summary>
public static class DesignValidator
{
    /// <summary>All errors and warnings of a design.</summary>
    public static IReadOnlyList<ValidationIssue> Validate(LoopDesign design)
    {
        var c = new Checks();
        switch (design.Plant)
        {
            case BuckPlant buck:
                ValidateBuck(c, buck, design.Compensator, design.Analysis);
                break;
            case CustomPlant custom:
                ValidateCustom(c, custom);
                break;
        }

        ValidateCompensator(c, design.Compensator);
        ValidateAnalysis(c, design.Analysis);
        ValidateCriteria(c, design.Criteria);
        if (design.Synthesis is { } synthesis)
        {
            ValidateSynthesis(c, synthesis, design.Compensator);
        }

        if (design.Tolerances is { } tolerances)
        {
            ValidateTolerances(c, tolerances, design.Plant);
        }

        return c.Issues;
    }

    private static void ValidateBuck(Checks c, BuckPlant buck, Compensator compensator, AnalysisSettings analysis)
    {
        const string p = "plant.powerStage";
        var s = buck.PowerStage;
        bool vinOk = c.Above($"{p}.inputVoltageV.min", s.InputVoltage.MinV, 0, 2000, "V")
            & c.Above($"{p}.inputVoltageV.nominal", s.InputVoltage.NominalV, 0, 2000, "V")
            & c.Above($"{p}.inputVoltageV.max", s.InputVoltage.MaxV, 0, 2000, "V");
        if (vinOk && !(s.InputVoltage.MinV <= s.InputVoltage.NominalV && s.InputVoltage.NominalV <= s.InputVoltage.MaxV))
        {
            c.Error($"{p}.inputVoltageV", $"needs min <= nominal <= max; got {Format(s.InputVoltage.MinV, "V")}, {Format(s.InputVoltage.NominalV, "V")}, {Format(s.InputVoltage.MaxV, "V")}.");
            vinOk = false;
        }

        bool voutOk = c.Above($"{p}.outputVoltageV", s.OutputVoltageV, 0, 1000, "V");
        bool loadOk = c.InRange($"{p}.loadCurrentA.min", s.LoadCurrent.MinA, 0, 10000, "A")
            & c.Above($"{p}.loadCurrentA.max", s.LoadCurrent.MaxA, 0, 10000, "A");
        if (loadOk && s.LoadCurrent.MinA > s.LoadCurrent.MaxA)
        {
            c.Error($"{p}.loadCurrentA", $"needs min <= max; got {Format(s.LoadCurrent.MinA, "A")} and {Format(s.LoadCurrent.MaxA, "A")}.");
            loadOk = false;
        }

        if (loadOk && s.LoadCurrent.NominalA is double nominal && !(nominal >= s.LoadCurrent.MinA && nominal <= s.LoadCurrent.MaxA))
        {
            c.Error($"{p}.loadCurrentA.nominal", $"must lie between min and max ({Format(s.LoadCurrent.MinA, "A")} to {Format(s.LoadCurrent.MaxA, "A")}); got {Format(nominal, "A")}.");
            loadOk = false;
        }

        bool fsOk = c.InRange($"{p}.switchingFrequencyHz", s.SwitchingFrequencyHz, 1e3, 100e6, "Hz");
        if (fsOk && s.SwitchingFrequencyHz < 20e3)
        {
            c.Warn($"{p}.switchingFrequencyHz", $"{Format(s.SwitchingFrequencyHz, "Hz")} is in the audible range (below 20 kHz): the magnetics may be heard.");
        }

        bool lOk = c.InRange($"{p}.inductor.inductanceH", s.Inductor.InductanceH, 1e-9, 1.0, "H")
            & c.InRange($"{p}.inductor.dcrOhm", s.Inductor.DcrOhm, 0, 100, "Ohm");
        if (s.OutputCapacitors.IsDefaultOrEmpty)
        {
            c.Error($"{p}.outputCapacitors", "needs at least one capacitor branch.");
            lOk = false;
        }
        else
        {
            for (int i = 0; i < s.OutputCapacitors.Length; i++)
            {
                var b = s.OutputCapacitors[i];
                string q = $"{p}.outputCapacitors[{i}]";
                if (b.Count < 1 || b.Count > 10000)
                {
                    c.Error($"{q}.count", $"{b.Count} is out of range: allowed 1 to 10000 parts.");
                    lOk = false;
                }

                lOk &= c.InRange($"{q}.capacitanceF", b.CapacitanceF, 1e-12, 10.0, "F")
                    & c.InRange($"{q}.esrOhm", b.EsrOhm, 0, 100, "Ohm")
                    & c.InRange($"{q}.eslH", b.EslH, 0, 1e-6, "H");
            }
        }

        bool swOk = c.InRange($"{p}.highSideOnResistanceOhm", s.HighSideOnResistanceOhm, 0, 100, "Ohm")
            & c.InRange($"{p}.rectifier.onResistanceOhm", s.Rectifier.OnResistanceOhm, 0, 100, "Ohm")
            & c.InRange($"{p}.rectifier.forwardDropV", s.Rectifier.ForwardDropV, 0, 5, "V")
            & c.Above($"{p}.maxDutyCycle", s.MaxDutyCycle, 0, 1, "");
        if (s.Rectifier.Kind == RectifierKind.Synchronous && s.Rectifier.ForwardDropV > 0)
        {
            c.Warn($"{p}.rectifier.forwardDropV", "a synchronous rectifier has no forward drop in the model; the value is used as given.");
        }

        if (vinOk && voutOk && s.OutputVoltageV >= s.InputVoltage.MinV)
        {
            c.Error($"{p}.outputVoltageV", $"{Format(s.OutputVoltageV, "V")} must be below the minimum input {Format(s.InputVoltage.MinV, "V")}: a buck only steps down.");
            voutOk = false;
        }

        if (vinOk && voutOk && loadOk && lOk && swOk && fsOk)
        {
            var op = BuckOperatingPoint.Solve(s, new OperatingCondition(s.InputVoltage.MinV, s.LoadCurrent.MaxA));
            if (!(op.DutyCycle > 0) || !double.IsFinite(op.DutyCycle))
            {
                c.Error($"{p}.outputVoltageV", $"{Format(s.OutputVoltageV, "V")} cannot be reached at the minimum input {Format(s.InputVoltage.MinV, "V")} and full load: the losses leave no valid duty cycle (0 to {s.MaxDutyCycle:F3}); check the resistances and the diode drop.");
            }
            else if (op.DutyCycle > s.MaxDutyCycle)
            {
                c.Error($"{p}.outputVoltageV", $"{Format(s.OutputVoltageV, "V")} is not reachable at the minimum input {Format(s.InputVoltage.MinV, "V")} and full load: it needs a duty cycle of {op.DutyCycle:F3}, above the maximum {s.MaxDutyCycle:F3} (plant.powerStage.maxDutyCycle).");
            }
        }

        bool stageOk = vinOk && voutOk && loadOk && lOk && swOk && fsOk;
        ValidateControl(c, buck, stageOk);
        if (stageOk)
        {
            ValidateConductionModel(c, s, analysis);
        }

        const string f = "plant.feedback";
        var d = buck.Feedback;
        bool divOk = c.InRange($"{f}.topOhm", d.TopOhm, 1, 1e9, "Ohm")
            & c.InRange($"{f}.bottomOhm", d.BottomOhm, 1, 1e9, "Ohm")
            & c.InRange($"{f}.referenceV", d.ReferenceV, 0.01, 1000, "V");
        if (divOk && voutOk && Math.Abs(d.OutputVoltageV - s.OutputVoltageV) > 0.01 * s.OutputVoltageV)
        {
            c.Warn(f, $"the divider sets {Format(d.OutputVoltageV, "V")} ({Format(d.ReferenceV, "V")} x (1 + {Format(d.TopOhm, "Ohm")} / {Format(d.BottomOhm, "Ohm")})), more than 1 % from the output voltage {Format(s.OutputVoltageV, "V")}.");
        }

        if (divOk && compensator is OpAmpNetwork net && double.IsFinite(net.R1Ohm) && Math.Abs(net.R1Ohm - d.TopOhm) > 1e-6 * d.TopOhm)
        {
            c.Warn("compensator.r1Ohm", $"R1 ({Format(net.R1Ohm, "Ohm")}) is the divider's top resistor, but plant.feedback.topOhm is {Format(d.TopOhm, "Ohm")}; the loop uses R1.");
        }
    }

    private static void ValidateControl(Checks c, BuckPlant buck, bool stageOk)
    {
        const string k = "plant.control";
        var s = buck.PowerStage;
        switch (buck.Control)
        {
            case VoltageModeControl m:
                if (m.InputFeedforward)
                {
                    c.InRange($"{k}.feedforwardRampPerVolt", m.FeedforwardRampPerVolt, 1e-4, 10, "V/V");
                }
                else
                {
                    c.InRange($"{k}.rampAmplitudeV", m.RampAmplitudeV, 1e-3, 100, "V");
                }

                break;
            case PeakCurrentModeControl p:
                bool riOk = c.Above($"{k}.senseGainOhm", p.SenseGainOhm, 0, 100, "Ohm");
                bool rampOk = p.Ramp.Kind switch
                {
                    CompensationRampKind.VoltsPerSecond => c.InRange($"{k}.ramp.value", p.Ramp.Value, 0, 1e13, "V/s"),
                    CompensationRampKind.MultipleOfOffSlope => c.InRange($"{k}.ramp.value", p.Ramp.Value, 0, 100, ""),
                    _ => c.InRange($"{k}.ramp.value", p.Ramp.Value, 1, 100, ""),
                };
                if (!rampOk && double.IsFinite(p.Ramp.Value) && p.Ramp.Value < (p.Ramp.Kind == CompensationRampKind.Mc ? 1 : 0))
                {
                    c.Error($"{k}.ramp.value", p.Ramp.Kind == CompensationRampKind.Mc
                        ? "mc below 1 would be a negative compensation ramp (mc = 1 + Se / Sn): the ramp adds to the sensed current."
                        : "a negative compensation slope is not a ramp: Se is at least 0 V/s.");
                }

                if (riOk && stageOk)
                {
                    // The on-time slope is smallest at the lowest input and full load (CCM losses included).
                    var op = BuckOperatingPoint.SolveContinuous(s, new OperatingCondition(s.InputVoltage.MinV, s.LoadCurrent.MaxA));
                    if (!(op.OnIntervalInductorVoltageV > 0))
                    {
                        c.Error("plant.powerStage.inputVoltageV.min", $"the on-time inductor voltage Vin - Vout - I (Ron + DCR) is {Format(op.OnIntervalInductorVoltageV, "V")} at the minimum input and full load: the sensed slope Sn would not be positive.");
                    }
                }

                break;
            default:
                c.Error($"{k}.scheme", "must be voltage mode or peak current mode.");
                return;
        }

        c.InRange($"{k}.modulatorDelayS", buck.Control.ModulatorDelayS, 0, 1e-3, "s");
        c.InRange($"{k}.modulatorDelayFractionOfPeriod", buck.Control.ModulatorDelayFractionOfPeriod, 0, 2, "");
    }

    private static void ValidateConductionModel(Checks c, BuckPowerStage s, AnalysisSettings analysis)
    {
        var at = DesignAnalyzer.ConditionOf(s, analysis);
        var op = BuckOperatingPoint.Solve(s, at);
        switch (analysis.ConductionModel)
        {
            case ConductionModelChoice.Discontinuous when s.Rectifier.Kind == RectifierKind.Synchronous:
                c.Error("analysis.conductionModel", "the DCM model was asked for, but a synchronous rectifier runs in forced CCM (its current reverses instead of stopping): the operating point is never in DCM.");
                return;
            case ConductionModelChoice.Discontinuous when op.Mode == ConductionMode.Continuous:
                c.Error("analysis.conductionModel", $"the DCM model was asked for, but the analysed load {Format(at.LoadCurrentA, "A")} is above the CCM/DCM boundary {Format(op.BoundaryLoadCurrentA, "A")}: the operating point is in CCM.");
                return;
            case ConductionModelChoice.Continuous:
                return;
        }

        if (op.Mode == ConductionMode.Discontinuous && !(at.LoadCurrentA > 0))
        {
            c.Error("analysis.load", "analyses the minimum load of 0 A with a diode rectifier: the converter skips pulses at no load and no averaged model holds. Analyse at analysis.load = max, or set plant.powerStage.loadCurrentA.min above 0.");
        }
    }

    private static void ValidateCustom(Checks c, CustomPlant plant)
    {
        const string p = "plant";
        if (plant.Form == CustomPlantForm.Coefficients)
        {
            bool ok = true;
            if (plant.NumeratorDescending.IsDefaultOrEmpty)
            {
                c.Error($"{p}.numerator", "needs at least one coefficient.");
                ok = false;
            }

            if (plant.DenominatorDescending.IsDefaultOrEmpty)
            {
                c.Error($"{p}.denominator", "needs at least one coefficient.");
                ok = false;
            }

            if (!ok)
            {
                return;
            }

            for (int i = 0; i < plant.NumeratorDescending.Length; i++)
            {
                ok &= c.InRange($"{p}.numerator[{i}]", plant.NumeratorDescending[i], -1e300, 1e300, "");
            }

            for (int i = 0; i < plant.DenominatorDescending.Length; i++)
            {
                ok &= c.InRange($"{p}.denominator[{i}]", plant.DenominatorDescending[i], -1e300, 1e300, "");
            }

            if (ok && plant.DenominatorDescending.All(v => v == 0))
            {
                c.Error($"{p}.denominator", "must not be all zeros.");
            }
            else if (ok && plant.NumeratorDescending.All(v => v == 0))
            {
                c.Error($"{p}.numerator", "must not be all zeros: the loop would have no gain.");
            }
            else if (ok)
            {
                try
                {
                    var tf = plant.TransferFunction();
                    if (!tf.IsProper)
                    {
                        c.Error($"{p}.numerator", "has a higher degree than the denominator: a physical plant is proper.");
                    }
                }
                catch (ArgumentException ex)
                {
                    c.Error($"{p}.denominator", $"its roots could not be found ({ex.Message}); scale the coefficients to a narrower span.");
                }
            }
        }
        else
        {
            if (plant.Zeros.IsDefault || plant.Poles.IsDefault)
            {
                c.Error(plant.Zeros.IsDefault ? $"{p}.zeros" : $"{p}.poles", "must be a list of factors (empty for none).");
                return;
            }

            if (!double.IsFinite(plant.Gain) || plant.Gain == 0 || Math.Abs(plant.Gain) > 1e300)
            {
                c.Error($"{p}.gain", "must be a finite, non-zero number.");
            }

            if (plant.OriginOrder < -3 || plant.OriginOrder > 3)
            {
                c.Error($"{p}.originOrder", $"{plant.OriginOrder} is out of range: allowed -3 to 3.");
            }

            CheckFactors(c, $"{p}.zeros", plant.Zeros);
            CheckFactors(c, $"{p}.poles", plant.Poles);
            int zeros = plant.Zeros.Sum(z => z.Order) + Math.Max(plant.OriginOrder, 0);
            int poles = plant.Poles.Sum(z => z.Order) + Math.Max(-plant.OriginOrder, 0);
            if (zeros > poles)
            {
                c.Error($"{p}.zeros", $"{zeros} zeros against {poles} poles: a physical plant is proper.");
            }
        }

        c.InRange($"{p}.delayS", plant.DelayS, 0, 1.0, "s");
        c.Above($"{p}.dividerRatio", plant.DividerRatio, 0, 1, "");
        if (plant.SwitchingFrequencyHz is double fs)
        {
            c.InRange($"{p}.switchingFrequencyHz", fs, 1, 100e6, "Hz");
        }
    }

    private static void CheckFactors(Checks c, string path, IReadOnlyList<Factor> factors)
    {
        for (int i = 0; i < factors.Count; i++)
        {
            c.InRange($"{path}[{i}].frequencyHz", factors[i].FrequencyHz, 1e-6, 1e12, "Hz");
            if (factors[i].Q is double q)
            {
                c.InRange($"{path}[{i}].q", q, 1e-3, 1e4, "");
            }
        }
    }

    private static void ValidateCompensator(Checks c, Compensator compensator)
    {
        const string p = "compensator";
        switch (compensator)
        {
            case CompensatorPlacement pl:
                if (pl.Gain.Kind == GainSettingKind.MidbandGainDb)
                {
                    if (pl.Type == CompensatorType.TypeI)
                    {
                        c.Error($"{p}.gain.kind", "a Type I compensator has no mid-band gain: use integratorHz or crossoverHz.");
                    }
                    else
                    {
                        c.InRange($"{p}.gain.value", pl.Gain.Value, -100, 100, "dB");
                    }
                }
                else
                {
                    c.InRange($"{p}.gain.value", pl.Gain.Value, 1e-3, 1e9, "Hz");
                }

                if (pl.Type != CompensatorType.TypeI)
                {
                    Need(c, $"{p}.zero1Hz", pl.Zero1Hz);
                    Need(c, $"{p}.pole1Hz", pl.Pole1Hz);
                }

                if (pl.Type == CompensatorType.TypeIII)
                {
                    Need(c, $"{p}.zero2Hz", pl.Zero2Hz);
                    Need(c, $"{p}.pole2Hz", pl.Pole2Hz);
                }

                break;
            case OpAmpNetwork n:
                c.InRange($"{p}.r1Ohm", n.R1Ohm, 1, 1e9, "Ohm");
                c.InRange($"{p}.c1F", n.C1F, 1e-15, 1, "F");
                if (n.Type != CompensatorType.TypeI)
                {
                    c.InRange($"{p}.r2Ohm", n.R2Ohm, 1, 1e9, "Ohm");
                    c.InRange($"{p}.c2F", n.C2F, 1e-15, 1, "F");
                }

                if (n.Type == CompensatorType.TypeIII)
                {
                    c.InRange($"{p}.r3Ohm", n.R3Ohm, 1, 1e9, "Ohm");
                    c.InRange($"{p}.c3F", n.C3F, 1e-15, 1, "F");
                }

                c.InRange($"{p}.rBottomOhm", n.RBottomOhm, 0, 1e9, "Ohm");
                switch (n.Amplifier)
                {
                    case OpAmp a:
                        bool a0 = c.InRange($"{p}.amplifier.openLoopGain", a.OpenLoopGain, 10, 1e9, "V/V");
                        bool gbw = c.InRange($"{p}.amplifier.gainBandwidthHz", a.GainBandwidthHz, 1e3, 1e11, "Hz");
                        if (a.SecondPoleHz is double f2 && c.InRange($"{p}.amplifier.secondPoleHz", f2, 1e3, 1e12, "Hz") && a0 && gbw && f2 <= a.DominantPoleHz)
                        {
                            c.Error($"{p}.amplifier.secondPoleHz", $"{Format(f2, "Hz")} must be above the dominant pole GBW / A0 = {Format(a.DominantPoleHz, "Hz")}.");
                        }

                        break;
                    case Transconductance:
                        c.Error($"{p}.amplifier.kind", "a transconductance amplifier drives a network to ground, not an inverting feedback network: use the transconductance compensator form (compensator.form = ota).");
                        break;
                }

                break;
            case TransconductanceNetwork g:
                if (g.Type == CompensatorType.TypeIII)
                {
                    c.Error($"{p}.type", "a transconductance compensator is Type I or Type II here (a Type III needs a capacitor across the divider's top resistor).");
                }

                c.InRange($"{p}.amplifier.transconductanceS", g.Amplifier.TransconductanceS, 1e-6, 0.1, "S");
                c.InRange($"{p}.amplifier.outputResistanceOhm", g.Amplifier.OutputResistanceOhm, 1e3, 1e10, "Ohm");
                c.InRange($"{p}.c1F", g.C1F, 1e-15, 1, "F");
                if (g.Type == CompensatorType.TypeII)
                {
                    c.InRange($"{p}.r2Ohm", g.R2Ohm, 1, 1e9, "Ohm");
                    c.InRange($"{p}.c2F", g.C2F, 1e-15, 1, "F");
                }

                break;
        }
    }

    private static void Need(Checks c, string field, double? value)
    {
        if (value is not double v)
        {
            c.Error(field, "is required for this compensator type: a frequency from 1 mHz to 1 GHz.");
        }
        else
        {
            c.InRange(field, v, 1e-3, 1e9, "Hz");
        }
    }

    private static void ValidateAnalysis(Checks c, AnalysisSettings a)
    {
        const string p = "analysis";
        bool ok = c.InRange($"{p}.startHz", a.StartHz, 1e-3, 1e9, "Hz") & c.InRange($"{p}.stopHz", a.StopHz, 1e-3, 1e10, "Hz");
        if (ok && a.StopHz <= a.StartHz)
        {
            c.Error($"{p}.stopHz", $"{Format(a.StopHz, "Hz")} must be above analysis.startHz ({Format(a.StartHz, "Hz")}).");
        }

        if (a.Points < 10 || a.Points > 100000)
        {
            c.Error($"{p}.points", $"{a.Points} is out of range: allowed 10 to 100000.");
        }

        c.InRange($"{p}.loadStepA", a.LoadStepA, 0, 10000, "A");
        c.InRange($"{p}.loadStepSlewAPerS", a.LoadStepSlewAPerS, 0, 1e12, "A/s");
        c.InRange($"{p}.referenceStepV", a.ReferenceStepV, 0, 1000, "V");
        if (a.StepDurationS is double t)
        {
            c.Above($"{p}.stepDurationS", t, 0, 100, "s");
        }

        if (a.StepSamples < 10 || a.StepSamples > 1_000_000)
        {
            c.Error($"{p}.stepSamples", $"{a.StepSamples} is out of range: allowed 10 to 1000000.");
        }
    }

    private static void ValidateCriteria(Checks c, DesignCriteria k)
    {
        const string p = "criteria";
        c.InRange($"{p}.minPhaseMarginDeg", k.MinPhaseMarginDeg, 0, 180, "deg");
        c.InRange($"{p}.minGainMarginDb", k.MinGainMarginDb, 0, 100, "dB");
        c.Above($"{p}.maxCrossoverFractionOfSwitching", k.MaxCrossoverFractionOfSwitching, 0, 1, "");
        c.InRange($"{p}.minCrossoverHz", k.MinCrossoverHz, 0, 1e9, "Hz");
        if (k.MaxOvershootPct is double o)
        {
            c.InRange($"{p}.maxOvershootPct", o, 0, 1000, "%");
        }

        if (k.MaxLoadStepDeviationV is double v)
        {
            c.Above($"{p}.maxLoadStepDeviationV", v, 0, 1000, "V");
        }

        bool ok = c.InRange($"{p}.minRippleFraction", k.MinRippleFraction, 0, 10, "") & c.InRange($"{p}.maxRippleFraction", k.MaxRippleFraction, 0, 10, "");
        if (ok && k.MinRippleFraction > k.MaxRippleFraction)
        {
            c.Error($"{p}.minRippleFraction", "must not exceed criteria.maxRippleFraction.");
        }
    }

    /// <summary>The synthesis section: the ranges of the component synthesis (NetworkSynthesizer.Validate) and the designators.</summary>
    private static void ValidateSynthesis(Checks c, SynthesisSettings s, Compensator compensator)
    {
        const string p = "synthesis";
        if (s.R1Ohm is double r1)
        {
            c.InRange($"{p}.r1Ohm", r1, 1, 1e9, "Ohm");
        }

        foreach (string d in s.TolerancesPct.Keys.Where(d => !SynthesisSettings.Designators.Contains(d)))
        {
            c.Error($"{p}.tolerances.{d}", $"'{d}' is not a part of an op-amp network: allowed {string.Join(", ", SynthesisSettings.Designators)}.");
        }

        // R1 is checked above against the same range as compensator.r1Ohm.
        c.AddRange(NetworkSynthesizer.Validate(s.ToOptions() with { R1Ohm = null }));
        var present = new HashSet<string>(compensator.Type switch
        {
            CompensatorType.TypeI => ["R1", "C1"],
            CompensatorType.TypeII => ["R1", "R2", "C1", "C2"],
            _ => ["R1", "R2", "R3", "C1", "C2", "C3"],
        }, StringComparer.Ordinal) { OpAmpNetworkParts.DividerBottom };
        foreach (string d in s.TolerancesPct.Keys.Where(d => SynthesisSettings.Designators.Contains(d) && !present.Contains(d)))
        {
            c.Warn($"{p}.tolerances.{d}", $"a {compensator.Type} network has no {d}; its tolerance is not used.");
        }
    }

    /// <summary>
    /// The tolerances section: bands 0 to 90 % (a band of 100 % or more would take a part to zero), DC-bias factors 0.05 to
    /// 1, temperature multipliers 0.1 to 1 (low) and 1 to 10 (high); our limits, no source. Capacitor entries are checked
    /// in label order (the order the writer writes them) and must name an output-capacitor branch.
    /// </summary>
    private static void ValidateTolerances(Checks c, ToleranceSpec t, Plant plant)
    {
        const string p = "tolerances";
        c.InRange($"{p}.inductancePct", t.InductancePct, 0, 90, "%");
        c.InRange($"{p}.capacitancePct", t.CapacitancePct, 0, 90, "%");
        Factor(c, $"{p}.dcBiasFactor", t.DcBiasFactor, 0.05, 1);
        Factor(c, $"{p}.esrLowFactor", t.EsrLowFactor, 0.1, 1);
        Factor(c, $"{p}.esrHighFactor", t.EsrHighFactor, 1, 10);
        Factor(c, $"{p}.dcrLowFactor", t.DcrLowFactor, 0.1, 1);
        Factor(c, $"{p}.dcrHighFactor", t.DcrHighFactor, 1, 10);
        c.InRange($"{p}.senseGainPct", t.SenseGainPct, 0, 90, "%");
        c.InRange($"{p}.rampPct", t.RampPct, 0, 90, "%");
        c.InRange($"{p}.transconductancePct", t.TransconductancePct, 0, 90, "%");
        var labels = plant is BuckPlant b ? b.PowerStage.OutputCapacitors.Select(x => x.Label).ToList() : [];
        int i = 0;
        foreach (var (label, tolerance) in t.Capacitors)
        {
            string at = $"{p}.capacitors[{i++}]";
            c.InRange($"{at}.tolerancePct", tolerance.TolerancePct, 0, 90, "%");
            Factor(c, $"{at}.dcBiasFactor", tolerance.DcBiasFactor, 0.05, 1);
            if (plant is not BuckPlant)
            {
                c.Warn($"{at}.label", $"a custom plant has no output capacitors: the tolerance of '{label}' is not used.");
            }
            else if (!labels.Contains(label, StringComparer.Ordinal))
            {
                c.Error($"{at}.label", $"'{label}' names no output-capacitor branch: the labels of plant.powerStage.outputCapacitors are {string.Join(", ", labels.Select(l => $"'{l}'"))}.");
            }
        }
    }

    /// <summary>Requires min &lt;= value &lt;= max for a plain multiplier, shown as a plain number ("0.05", not "50.0m").</summary>
    private static void Factor(Checks c, string field, double value, double min, double max)
    {
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        if (!double.IsFinite(value))
        {
            c.Error(field, string.Create(inv, $"must be a finite number from {min:G4} to {max:G4}."));
        }
        else if (value < min || value > max)
        {
            c.Error(field, string.Create(inv, $"{value:G4} is out of range: allowed {min:G4} to {max:G4}."));
        }
    }
}
