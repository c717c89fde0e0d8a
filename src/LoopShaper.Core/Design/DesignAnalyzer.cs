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
    public static DesignAnalysis Analyze(LoopDesign design) => AnalyzeDesign(design, everyCorner: true);

    /// <summary>
    /// Analyses a design as <see cref="Analyze(LoopDesign)"/> does, except that the input and load corners
    /// (<see cref="DesignAnalysis.Corners"/>) are computed only where the warnings need them (peak current mode, for
    /// subharmonic oscillation at the worst corner); otherwise they are left empty. For the workspace, which analyses on
    /// every keystroke and shows the corners from its own sweep; reports and the command line use
    /// <see cref="Analyze(LoopDesign)"/>.
    /// </summary>
    public static DesignAnalysis AnalyzeInteractive(LoopDesign design) => AnalyzeDesign(design, everyCorner: false);

    private static DesignAnalysis AnalyzeDesign(LoopDesign design, bool everyCorner)
    {
        var issues = DesignValidator.Validate(design).ToImmutableArray();
        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return new DesignAnalysis { Design = design, Issues = issues };
        }

        try
        {
            return AnalyzeValid(design, issues, everyCorner);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return new DesignAnalysis { Design = design, Issues = issues.Add(new ValidationIssue("design", "could not be analysed: " + ex.Message)) };
        }
    }

    /// <summary>The operating condition an analysis setting picks from the power stage.</summary>
    public static OperatingCondition ConditionOf(BuckPowerStage stage, AnalysisSettings settings) => new(
        settings.Input switch { InputCorner.Min => stage.InputVoltage.MinV, InputCorner.Max => stage.InputVoltage.MaxV, _ => stage.InputVoltage.NominalV },
        settings.Load switch { LoadCorner.Min => stage.LoadCurrent.MinA, LoadCorner.Nominal => stage.LoadCurrent.EffectiveNominalA, _ => stage.LoadCurrent.MaxA });

    /// <summary>
    /// Builds the loop of a design at an operating condition (power-stage plants). The plant model follows the plant's
    /// control record (voltage mode or peak current mode) and the operating point's conduction mode (CCM, or DCM for a
    /// diode rectifier below the boundary load), unless analysis.conductionModel forces one.
    /// </summary>
    public static AssembledLoop BuildLoop(LoopDesign design, OperatingCondition? condition = null)
    {
        TransferFunction plant, modulator;
        TransferFunction? gvg = null, zout = null, ti = null;
        double divider;
        OperatingPoint? op = null;
        PeakCurrentModeFigures? figures = null;
        SmallSignalModel model = SmallSignalModel.Custom;
        var compensator = design.Compensator;
        var steps = new List<Derivation>();
        switch (design.Plant)
        {
            case BuckPlant buck:
                var stage = buck.PowerStage;
                var at = condition ?? ConditionOf(stage, design.Analysis);
                op = SolveOperatingPoint(stage, at, design.Analysis.ConductionModel);
                steps.AddRange(op.Derivations);
                divider = buck.Feedback.Ratio;
                if (compensator is OpAmpNetwork { RBottomOhm: 0.0 } net)
                {
                    compensator = net with { RBottomOhm = buck.Feedback.BottomOhm };
                }

                switch (buck.Control)
                {
                    case VoltageModeControl vmc:
                        var tfs = op.RectifierConductionFraction is null ? VoltageModeBuck.TransferFunctions(stage, op) : DcmBuck.TransferFunctions(stage, op);
                        double vm = vmc.RampAt(at.InputVoltageV);
                        double td = vmc.TotalDelayS(stage.SwitchingFrequencyHz);
                        modulator = TransferFunction.Constant(1.0 / vm).WithDelay(td);
                        plant = tfs.ControlToOutput;
                        gvg = vmc.InputFeedforward
                            ? tfs.LineToOutput.Add(tfs.ControlToOutput.Scale(-op.DutyCycle / at.InputVoltageV))
                            : tfs.LineToOutput;
                        zout = tfs.OutputImpedance;
                        model = tfs.Model;
                        steps.AddRange(tfs.Derivations);
                        steps.Add(new Derivation("Modulator gain", "Fm = 1 / Vm", $"Fm = 1 / {Format(vm, "V")}", Format(1.0 / vm, "1/V"), "Erickson & Maksimovic, 2nd ed., sec. 7.3"));
                        if (td > 0)
                        {
                            steps.Add(new Derivation("Modulator delay", "Td = delay + fraction x Ts, e^(-s Td) exact in T(s)", string.Create(CultureInfo.InvariantCulture, $"Td = {Format(vmc.ModulatorDelayS, "s")} + {vmc.ModulatorDelayFractionOfPeriod:G4} x {Format(1.0 / stage.SwitchingFrequencyHz, "s")}"), Format(td, "s"), "pure delay, shared/CONVENTIONS.md"));
                        }

                        break;
                    case PeakCurrentModeControl pcm:
                        var cm = PeakCurrentModeBuck.TransferFunctions(stage, op, pcm);
                        // The modulator delay is kept as the modulator block, the rest of Fm is inside Gvc.
                        modulator = TransferFunction.Delay(cm.ControlToOutput.DelayS);
                        plant = cm.ControlToOutput.WithoutDelay();
                        gvg = cm.LineToOutput;
                        zout = cm.OutputImpedance;
                        ti = cm.CurrentLoopGain;
                        figures = cm.CurrentMode;
                        model = cm.Model;
                        steps.AddRange(cm.Derivations);
                        break;
                    default:
                        throw new InvalidOperationException("Unknown control scheme.");
                }

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

        double sense = compensator.TakesDividedOutput ? divider : 1.0;
        var rest = modulator.Multiply(plant).Scale(sense);
        var gc = compensator.TransferFunction(rest);
        var ideal = compensator.HasIdealAmplifier ? null : compensator.IdealTransferFunction(rest);
        var loop = new LoopModel(gc, modulator, plant, sense, divider, gvg, zout);
        return new AssembledLoop(loop, op, [.. steps], model, figures, ti, ideal);
    }

    /// <summary>
    /// The operating point the analysis uses: the physical one (automatic), the CCM solution when the CCM model is forced,
    /// and the DCM solution when the DCM model is forced (only where the point is in DCM; the validator says so otherwise).
    /// </summary>
    public static OperatingPoint SolveOperatingPoint(BuckPowerStage stage, OperatingCondition at, ConductionModelChoice choice)
    {
        if (choice == ConductionModelChoice.Continuous)
        {
            return BuckOperatingPoint.SolveContinuous(stage, at);
        }

        var op = BuckOperatingPoint.Solve(stage, at);
        if (choice == ConductionModelChoice.Discontinuous && op.RectifierConductionFraction is null)
        {
            throw new InvalidOperationException($"analysis.conductionModel: the DCM model was asked for, but the operating point at {Format(at.LoadCurrentA, "A")} is in CCM.");
        }

        return op;
    }

    private static DesignAnalysis AnalyzeValid(LoopDesign design, ImmutableArray<ValidationIssue> issues, bool everyCorner)
    {
        var built = BuildLoop(design);
        var (loop, op, plantSteps) = (built.Loop, built.OperatingPoint, built.Derivations);
        var a = design.Analysis;
        var placement = Resolve(design.Compensator, loop.Plant);
        var t = loop.LoopGain;
        var margins = MarginAnalyzer.Analyze(t, a.StartHz, a.StopHz);
        // One grid for plant, compensator and loop, denser near their poles and zeros.
        var grid = new FrequencyGrid(a.StartHz, a.StopHz, a.Points).Adaptive([loop.Plant, loop.Compensator]);
        double fc = margins.CrossoverHz ?? Math.Sqrt(a.StartHz * a.StopHz);
        int? pade = loop.PadeOrder(fc);
        double duration = a.StepDurationS ?? (20.0 / fc);

        // The input and load corners and the load step do not depend on the rest: they run beside it (both cores).
        var cornersTask = design.Plant is BuckPlant cb && (everyCorner || cb.Control is PeakCurrentModeControl)
            ? Task.Run(() => Corners(design, cb))
            : Task.FromResult(ImmutableArray<CornerResult>.Empty);
        var loadStepTask = Task.Run(() =>
        {
            if (loop.ClosedOutputImpedance(pade) is not TransferFunction zcl)
            {
                return null;
            }

            // A load step of +I draws current from the output: vout = -Zout_cl I.
            double rise = a.LoadStepSlewAPerS > 0 ? a.LoadStepA / a.LoadStepSlewAPerS : 0.0;
            var ls = StepSimulator.SimulateSlewed(zcl, rise, duration, a.StepSamples, -a.LoadStepA);
            return pade is null ? ls : ls with { Delay = DelayTreatment.Pade, PadeOrder = pade };
        });
        var refTf = loop.ReferenceToOutput(pade);
        var refStep = Simulate(refTf, duration, a.StepSamples, a.ReferenceStepV, pade);

        var plantResponse = FrequencyResponse.Of(loop.Plant, grid);
        var compResponse = FrequencyResponse.Of(loop.Compensator, grid);
        var steps = new List<Derivation>(plantSteps);
        steps.AddRange(CompensatorDerivations(design.Compensator, placement, loop));
        steps.AddRange(MarginDerivations(margins));

        StabilityMargins? currentMargins = null;
        FrequencyResponse? currentResponse = null;
        if (built.CurrentLoopGain is TransferFunction ti && design.Plant is BuckPlant pb)
        {
            // The current loop is analysed up to the switching frequency: its model (He) holds to fs / 2.
            currentMargins = MarginAnalyzer.Analyze(ti, a.StartHz, Math.Max(pb.PowerStage.SwitchingFrequencyHz, a.StartHz * 10));
            currentResponse = FrequencyResponse.Of(ti, grid);
            if (currentMargins.CrossoverHz is double fci && currentMargins.PhaseMarginDeg is double pmi)
            {
                steps.Add(new Derivation("Current-loop crossover", "|Ti(j 2 pi fci)| = 1, Ti = Fm Ri He Gid", string.Create(CultureInfo.InvariantCulture, $"PM = {pmi:F1} deg"), Format(fci, "Hz"), "Ridley 1991 (current-loop gain)"));
            }
        }

        FrequencyResponse? idealComp = null, idealLoop = null;
        StabilityMargins? idealMargins = null;
        if (built.IdealAmplifierCompensator is TransferFunction gi)
        {
            idealComp = FrequencyResponse.Of(gi, grid);
            idealLoop = plantResponse.Times(idealComp);
            idealMargins = MarginAnalyzer.Analyze(gi.Multiply(loop.Plant), a.StartHz, a.StopHz);
        }

        var corners = Joined(cornersTask);
        var loadStep = Joined(loadStepTask);
        var warnings = Warnings(design, op, margins, built, corners);
        var criteria = Criteria(design, op, margins, refStep, loadStep);
        return new DesignAnalysis
        {
            Design = design,
            Issues = issues,
            OperatingPoint = op,
            Loop = loop,
            Model = built.Model,
            CurrentMode = built.CurrentMode,
            CurrentLoopResponse = currentResponse,
            CurrentLoopMargins = currentMargins,
            IdealAmplifierCompensatorResponse = idealComp,
            IdealAmplifierLoopResponse = idealLoop,
            IdealAmplifierMargins = idealMargins,
            Corners = corners,
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

    /// <summary>
    /// The loop at each input corner (min, nominal, max) and load corner (min, max), with the model used at each. A
    /// placement whose gain is a crossover target is resolved once, at the main operating point: the compensator is
    /// the same hardware at every corner.
    /// </summary>
    public static ImmutableArray<CornerResult> Corners(LoopDesign design, BuckPlant buck)
    {
        var s = buck.PowerStage;
        if (design.Compensator is CompensatorPlacement { Gain.Kind: GainSettingKind.CrossoverHz } target)
        {
            design = design with { Compensator = Resolve(target, BuildLoop(design).Loop.Plant) };
        }

        var result = new List<CornerResult>();
        foreach (var input in new[] { InputCorner.Min, InputCorner.Nominal, InputCorner.Max })
        {
            foreach (var load in new[] { LoadCorner.Min, LoadCorner.Max })
            {
                var at = ConditionOf(s, new AnalysisSettings(Input: input, Load: load));
                var physical = BuckOperatingPoint.Solve(s, at);
                if (physical.Mode == ConductionMode.Discontinuous && at.LoadCurrentA <= 0 && design.Analysis.ConductionModel != ConductionModelChoice.Continuous)
                {
                    result.Add(new CornerResult(input, load, at, physical.Mode, null, physical.DutyCycle, null, null, null, null, null, "no load with a diode rectifier: the converter skips pulses and no averaged model holds"));
                    continue;
                }

                if (design.Analysis.ConductionModel == ConductionModelChoice.Discontinuous && physical.Mode == ConductionMode.Continuous)
                {
                    result.Add(new CornerResult(input, load, at, physical.Mode, null, physical.DutyCycle, null, null, null, null, null, "CCM here: the forced DCM model does not apply"));
                    continue;
                }

                try
                {
                    var built = BuildLoop(design, at);
                    var m = MarginAnalyzer.Analyze(built.Loop.LoopGain, design.Analysis.StartHz, design.Analysis.StopHz);
                    result.Add(new CornerResult(input, load, at, physical.Mode, built.Model, built.OperatingPoint!.DutyCycle, m.CrossoverHz, m.PhaseMarginDeg, m.UpperGainMarginDb, m.IsClosedLoopStable, built.CurrentMode?.Qp,
                        built.CurrentMode is { IsSubharmonicallyUnstable: true } ? "subharmonic oscillation: the current loop is unstable here" : null));
                }
                catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
                {
                    result.Add(new CornerResult(input, load, at, physical.Mode, null, physical.DutyCycle, null, null, null, null, null, "not analysed: " + ex.Message));
                }
            }
        }

        return [.. result];
    }

    /// <summary>The result of a task run beside the analysis; its exception, if any, as thrown (not wrapped).</summary>
    private static T Joined<T>(Task<T> task) => task.GetAwaiter().GetResult();

    private static StepResponse Simulate(TransferFunction h, double duration, int samples, double amplitude, int? pade)
    {
        var r = StepSimulator.Simulate(h, duration, samples, amplitude);
        return pade is null ? r : r with { Delay = DelayTreatment.Pade, PadeOrder = pade };
    }

    /// <summary>The compensator as a placement with its gain as an integrator frequency (ideal amplifier for parts-based networks).</summary>
    public static CompensatorPlacement Resolve(Compensator compensator, TransferFunction plant) => compensator switch
    {
        OpAmpNetwork n => n.ToPlacement(),
        TransconductanceNetwork g => g.ToPlacement(),
        CompensatorPlacement p => p with { Gain = new GainSetting(GainSettingKind.IntegratorHz, p.IntegratorHz(plant)) },
        _ => throw new InvalidOperationException("Unknown compensator kind."),
    };

    private static IEnumerable<Derivation> CompensatorDerivations(Compensator compensator, CompensatorPlacement placement, LoopModel loop)
    {
        const string src = "Venable 1983; Basso 2012, ch. 3 (op-amp Type I/II/III networks)";
        var inv = CultureInfo.InvariantCulture;
        if (compensator is TransconductanceNetwork g)
        {
            const string ota = "Basso 2012, ch. 3 (OTA compensators); Gc = gm (Ro || Zn) multiplied out here";
            double gm = g.Amplifier.TransconductanceS, ro = g.Amplifier.OutputResistanceOhm;
            yield return new("Sense gain ahead of the OTA", "H = Hdiv = Rbottom / (Rtop + Rbottom)", "from plant.feedback", loop.SenseGain.ToString("F4", inv), "divider ratio");
            yield return new("Integrator frequency (Ro infinite)", "fi = gm / (2 pi (C1 + C2))", $"fi = {Format(gm, "S")} / (2 pi x ({Format(g.C1F, "F")} + {Format(g.C2F, "F")}))", Format(placement.Gain.Value, "Hz"), ota);
            if (g.Type == CompensatorType.TypeII)
            {
                yield return new("Zero", "fz = 1 / (2 pi R2 C1)", $"fz = 1 / (2 pi x {Format(g.R2Ohm, "Ohm")} x {Format(g.C1F, "F")})", Format(placement.Zero1Hz!.Value, "Hz"), ota);
                yield return new("Pole", "fp = (C1 + C2) / (2 pi R2 C1 C2)", $"fp = ({Format(g.C1F, "F")} + {Format(g.C2F, "F")}) / (2 pi x {Format(g.R2Ohm, "Ohm")} x {Format(g.C1F, "F")} x {Format(g.C2F, "F")})", Format(placement.Pole1Hz!.Value, "Hz"), ota);
            }

            yield return new("DC gain of the OTA", "Gc(0) = gm Ro", $"Gc(0) = {Format(gm, "S")} x {Format(ro, "Ohm")}", string.Create(inv, $"{gm * ro:G4} V/V ({20 * Math.Log10(gm * ro):F1} dB)"), ota);
            yield return new("Low-frequency pole from Ro", "fLF = 1 / (2 pi Ro (C1 + C2)) (approximately, for Ro >> R2)", $"fLF = 1 / (2 pi x {Format(ro, "Ohm")} x ({Format(g.C1F, "F")} + {Format(g.C2F, "F")}))", Format(1.0 / (2 * Math.PI * ro * (g.C1F + g.C2F)), "Hz"), ota);
            yield return new("Compensator transfer function (exact)", "Gc = gm Ro Nn / (Ro Dn + Nn), Zn = Nn / Dn", loop.Compensator.ToString(), "", ota);
            yield break;
        }

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

            if (n.Amplifier is OpAmp amp)
            {
                const string real = "nodal analysis of the inverting node with vn = -vo / A(s) (our derivation); single-pole op-amp model after Basso 2012, ch. 3";
                yield return new("Op-amp dominant pole", "fa = GBW / A0", string.Create(inv, $"fa = {Format(amp.GainBandwidthHz, "Hz")} / {amp.OpenLoopGain:G4}"), Format(amp.DominantPoleHz, "Hz"), real);
                yield return new("Finite-gain compensator (exact)", "Gc = (Zf / Zin) / (1 + (1 + Zf (1/Zin + 1/Rb)) / A(s)), A = A0 / ((1 + s/wa)(1 + s/w2))",
                    string.Create(inv, $"A0 = {amp.OpenLoopGain:G4}, GBW = {Format(amp.GainBandwidthHz, "Hz")}{(amp.SecondPoleHz is double f2 ? ", f2 = " + Format(f2, "Hz") : "")}"), loop.Compensator.ToString(), real);
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

    private static ImmutableArray<string> Warnings(LoopDesign design, OperatingPoint? op, StabilityMargins m, AssembledLoop built, ImmutableArray<CornerResult> corners)
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
                    w.Add($"DCM: with the diode rectifier the converter enters discontinuous conduction below {Format(light.BoundaryLoadCurrentA, "A")} load (at the maximum input); the DCM model (Sun et al. 2001) is used at those corners.");
                }
            }

            if (op is not null && op.Mode == ConductionMode.Discontinuous)
            {
                w.Add(built.Model is SmallSignalModel.VoltageModeDiscontinuous or SmallSignalModel.PeakCurrentModeDiscontinuous
                    ? "DCM at the analysed operating point: the full-order DCM averaged model is used."
                    : "DCM at the analysed operating point, but analysis.conductionModel forces the CCM model: it does not hold here.");
            }

            if (op is not null && s.Rectifier.Kind == RectifierKind.Diode && op.Condition.LoadCurrentA > 0
                && Math.Abs(op.Condition.LoadCurrentA - op.BoundaryLoadCurrentA) < 0.1 * op.BoundaryLoadCurrentA)
            {
                w.Add(string.Create(inv, $"The analysed load {Format(op.Condition.LoadCurrentA, "A")} is within 10 % of the CCM/DCM boundary {Format(op.BoundaryLoadCurrentA, "A")}: the small-signal behaviour changes abruptly at the boundary (the CCM and DCM models differ there); check the margins on both sides."));
            }

            if (buck.Control is PeakCurrentModeControl)
            {
                CurrentModeWarnings(w, built.CurrentMode, corners, s);
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

        if (m.LowerGainMarginDb is double lgm && -lgm < design.Criteria.MinGainMarginDb)
        {
            w.Add(string.Create(inv, $"Low lower gain margin: {lgm:F1} dB (conditionally stable: that much less gain makes the loop unstable)."));
        }

        if (!m.IsClosedLoopStable)
        {
            w.Add("The closed loop is UNSTABLE.");
        }

        w.AddRange(m.Notes);
        return [.. w];
    }

    /// <summary>Qp above this is flagged: common practice, no source (Qp near 1 is the usual target).</summary>
    public const double MaxQp = 2.0;

    private static void CurrentModeWarnings(List<string> w, PeakCurrentModeFigures? main, ImmutableArray<CornerResult> corners, BuckPowerStage s)
    {
        var inv = CultureInfo.InvariantCulture;
        if (main is { IsSubharmonicallyUnstable: true })
        {
            w.Add(string.Create(inv, $"SUBHARMONIC OSCILLATION: at D = {main.DutyCycle:F3}, mc D' - 0.5 = {main.DampingTerm:F3} <= 0, so the current loop is unstable (Ridley 1991: Qp = 1 / (pi (mc D' - 0.5))). A ramp of Se = {Format(main.SuggestedRampForUnityQpVPerS, "V/s")} (mc = {main.SuggestedMcForUnityQp:F3}) gives Qp = 1."));
        }
        else if (main is { Qp: double qp } && qp > MaxQp)
        {
            w.Add(string.Create(inv, $"High Qp: {qp:F2} at D = {main.DutyCycle:F3} (above {MaxQp:F0}, common practice, no source): the sampling double pole at {Format(main.SamplingPoleHz, "Hz")} peaks and the converter is close to subharmonic oscillation. Se = {Format(main.SuggestedRampForUnityQpVPerS, "V/s")} (mc = {main.SuggestedMcForUnityQp:F3}) gives Qp = 1."));
        }

        var worst = corners.Where(c => c.Mode == ConductionMode.Continuous && c.Model == SmallSignalModel.PeakCurrentModeContinuous).MaxBy(c => c.DutyCycle);
        if (worst is not null && main is not null && worst.DutyCycle > main.DutyCycle + 1e-9)
        {
            if (worst.Qp is null)
            {
                w.Add(string.Create(inv, $"SUBHARMONIC OSCILLATION at the {worst.Input.ToString().ToLowerInvariant()} input corner ({Format(worst.Condition.InputVoltageV, "V")}, D = {worst.DutyCycle:F3}): mc D' - 0.5 <= 0 there; add compensation ramp (mc >= {PeakCurrentModeBuck.McForQp(1.0, worst.DutyCycle):F3} gives Qp = 1 there)."));
            }
            else if (worst.Qp > MaxQp)
            {
                w.Add(string.Create(inv, $"High Qp: {worst.Qp:F2} at the {worst.Input.ToString().ToLowerInvariant()} input corner ({Format(worst.Condition.InputVoltageV, "V")}, D = {worst.DutyCycle:F3}); mc = {PeakCurrentModeBuck.McForQp(1.0, worst.DutyCycle):F3} gives Qp = 1 there."));
            }
        }

        if (main is not null && !main.IsDiscontinuous && s.InputVoltage.MinV > 0 && main.DutyCycle > 0.5 && main.Mc <= 1.0)
        {
            w.Add("Peak current mode above D = 0.5 without a compensation ramp: the current loop is unstable (subharmonic oscillation).");
        }
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
        if (m.LowerGainMarginDb is double lower)
        {
            // A conditionally stable loop: gain lowered by |lower| dB destabilises it; the same limit as the upper margin.
            r.Add(new("lower gain margin", "criteria.minGainMarginDb", -lower >= k.MinGainMarginDb, lower.ToString("F1", inv) + " dB", "<= -" + k.MinGainMarginDb.ToString("G4", inv) + " dB"));
        }

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
            // In DCM the current pulse is not the design's ripple: the CCM ripple at this input (twice the boundary load) is.
            double ripple = op.RectifierConductionFraction is null ? op.RippleCurrentApp : 2 * op.BoundaryLoadCurrentA;
            double frac = ripple / bp.PowerStage.LoadCurrent.MaxA;
            r.Add(new("ripple current / full load", "criteria.minRippleFraction", frac >= k.MinRippleFraction && frac <= k.MaxRippleFraction,
                (100 * frac).ToString("F0", inv) + " %", (100 * k.MinRippleFraction).ToString("F0", inv) + "-" + (100 * k.MaxRippleFraction).ToString("F0", inv) + " %"));
        }

        return [.. r];
    }
}
