using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>
/// The toleranced parameters of a design and the design they give at a set of factors. Power stage: L, each output
/// capacitor branch's capacitance (tolerance and DC-bias factor) and ESR, the DCR. Modulator: the ramp, the sense gain
/// in peak current mode. Amplifier: gm of an OTA. Compensator: every part of an op-amp or OTA network and the divider
/// (R1 top, R4 bottom), with the tolerances of the synthesis settings. A placement has no parts and no tolerance.
/// </summary>
public static class ToleranceModel
{
    /// <summary>The toleranced parameters, in a fixed order; <paramref name="spec"/> null takes the design's own (or the defaults).</summary>
    public static ImmutableArray<ToleranceParameter> Parameters(LoopDesign design, ToleranceSpec? spec = null)
    {
        spec ??= design.Tolerances ?? ToleranceSpec.Default;
        var list = new List<ToleranceParameter>();
        if (design.Plant is BuckPlant buck)
        {
            const string ps = "plant.powerStage";
            var s = buck.PowerStage;
            list.Add(Band("L", $"{ps}.inductor.inductanceH", ToleranceKind.Inductance, -1, s.Inductor.InductanceH, spec.InductancePct, 1.0));
            for (int i = 0; i < s.OutputCapacitors.Length; i++)
            {
                var b = s.OutputCapacitors[i];
                var t = spec.For(b);
                list.Add(Band($"C[{b.Label}]", $"{ps}.outputCapacitors[{i}].capacitanceF", ToleranceKind.Capacitance, i, b.CapacitanceF, t.TolerancePct, t.DcBiasFactor));
                if (b.EsrOhm > 0)
                {
                    list.Add(new ToleranceParameter($"ESR[{b.Label}]", $"{ps}.outputCapacitors[{i}].esrOhm", ToleranceKind.Esr, i, b.EsrOhm, 1.0, spec.EsrLowFactor, spec.EsrHighFactor));
                }
            }

            if (s.Inductor.DcrOhm > 0)
            {
                list.Add(new ToleranceParameter("DCR", $"{ps}.inductor.dcrOhm", ToleranceKind.Dcr, -1, s.Inductor.DcrOhm, 1.0, spec.DcrLowFactor, spec.DcrHighFactor));
            }

            switch (buck.Control)
            {
                case VoltageModeControl vm:
                    list.Add(vm.InputFeedforward
                        ? Band("ramp", "plant.control.feedforwardRampPerVolt", ToleranceKind.Ramp, -1, vm.FeedforwardRampPerVolt, spec.RampPct, 1.0)
                        : Band("ramp", "plant.control.rampAmplitudeV", ToleranceKind.Ramp, -1, vm.RampAmplitudeV, spec.RampPct, 1.0));
                    break;
                case PeakCurrentModeControl pcm:
                    list.Add(Band("Ri", "plant.control.senseGainOhm", ToleranceKind.SenseGain, -1, pcm.SenseGainOhm, spec.SenseGainPct, 1.0));
                    double rampValue = pcm.Ramp.Kind == CompensationRampKind.Mc ? pcm.Ramp.Value - 1.0 : pcm.Ramp.Value;
                    if (rampValue > 0)
                    {
                        list.Add(Band("ramp", "plant.control.ramp.value", ToleranceKind.Ramp, -1, rampValue, spec.RampPct, 1.0));
                    }

                    break;
            }
        }

        var synthesis = design.Synthesis ?? new SynthesisSettings();
        void Part(string designator, string path, double value)
        {
            if (value > 0)
            {
                double pct = synthesis.TolerancesPct.TryGetValue(designator, out double own) ? own
                    : designator[0] == 'R' ? synthesis.ResistorTolerancePct : synthesis.CapacitorTolerancePct;
                list.Add(Band(designator, path, ToleranceKind.CompensatorPart, -1, value, pct, 1.0));
            }
        }

        var feedback = (design.Plant as BuckPlant)?.Feedback;
        switch (design.Compensator)
        {
            case OpAmpNetwork n:
                Part("R1", "compensator.r1Ohm", n.R1Ohm);
                Part("C1", "compensator.c1F", n.C1F);
                if (n.Type != CompensatorType.TypeI)
                {
                    Part("R2", "compensator.r2Ohm", n.R2Ohm);
                    Part("C2", "compensator.c2F", n.C2F);
                }

                if (n.Type == CompensatorType.TypeIII)
                {
                    Part("R3", "compensator.r3Ohm", n.R3Ohm);
                    Part("C3", "compensator.c3F", n.C3F);
                }

                if (n.Amplifier is OpAmp)
                {
                    Part("R4", n.RBottomOhm > 0 ? "compensator.rBottomOhm" : "plant.feedback.bottomOhm", n.RBottomOhm > 0 ? n.RBottomOhm : feedback?.BottomOhm ?? 0.0);
                }

                break;
            case TransconductanceNetwork g:
                if (feedback is not null)
                {
                    Part("R1", "plant.feedback.topOhm", feedback.TopOhm);
                    Part("R4", "plant.feedback.bottomOhm", feedback.BottomOhm);
                }

                list.Add(Band("gm", "compensator.amplifier.transconductanceS", ToleranceKind.Transconductance, -1, g.Amplifier.TransconductanceS, spec.TransconductancePct, 1.0));
                Part("C1", "compensator.c1F", g.C1F);
                if (g.Type == CompensatorType.TypeII)
                {
                    Part("R2", "compensator.r2Ohm", g.R2Ohm);
                    Part("C2", "compensator.c2F", g.C2F);
                }

                break;
        }

        return [.. list];
    }

    /// <summary>The factors of a tolerance set (the worst case needs <see cref="CornerSweep"/>, which measures the sensitivities).</summary>
    public static double[] Factors(ImmutableArray<ToleranceParameter> parameters, ToleranceSet set) => set switch
    {
        ToleranceSet.AllLow => [.. parameters.Select(p => p.LowFactor)],
        ToleranceSet.AllHigh => [.. parameters.Select(p => p.HighFactor)],
        _ => [.. parameters.Select(p => p.NominalFactor)],
    };

    /// <summary>The design with every parameter at its factor: value = entered value x factor.</summary>
    public static LoopDesign Apply(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, IReadOnlyList<double> factors)
    {
        if (factors.Count != parameters.Length)
        {
            throw new ArgumentException($"Expected {parameters.Length} factors, got {factors.Count}.", nameof(factors));
        }

        var plant = design.Plant;
        var compensator = design.Compensator;
        BuckPlant? buck = plant as BuckPlant;
        var stage = buck?.PowerStage;
        var caps = stage?.OutputCapacitors.ToArray();
        var control = buck?.Control;
        var feedback = buck?.Feedback;
        for (int i = 0; i < parameters.Length; i++)
        {
            var p = parameters[i];
            double v = p.ValueAt(factors[i]);
            switch (p.Kind)
            {
                case ToleranceKind.Inductance:
                    stage = stage! with { Inductor = stage.Inductor with { InductanceH = v } };
                    break;
                case ToleranceKind.Dcr:
                    stage = stage! with { Inductor = stage.Inductor with { DcrOhm = v } };
                    break;
                case ToleranceKind.Capacitance:
                    caps![p.Branch] = caps[p.Branch] with { CapacitanceF = v };
                    break;
                case ToleranceKind.Esr:
                    caps![p.Branch] = caps[p.Branch] with { EsrOhm = v };
                    break;
                case ToleranceKind.SenseGain:
                    control = ((PeakCurrentModeControl)control!) with { SenseGainOhm = v };
                    break;
                case ToleranceKind.Ramp:
                    control = control switch
                    {
                        VoltageModeControl { InputFeedforward: true } vm => vm with { FeedforwardRampPerVolt = v },
                        VoltageModeControl vm => vm with { RampAmplitudeV = v },
                        PeakCurrentModeControl pcm => pcm with { Ramp = pcm.Ramp with { Value = pcm.Ramp.Kind == CompensationRampKind.Mc ? 1.0 + v : v } },
                        _ => control,
                    };
                    break;
                case ToleranceKind.Transconductance:
                    var ota = (TransconductanceNetwork)compensator;
                    compensator = ota with { Amplifier = ota.Amplifier with { TransconductanceS = v } };
                    break;
                case ToleranceKind.CompensatorPart:
                    (compensator, feedback) = WithPart(compensator, feedback, p, v);
                    break;
            }
        }

        if (buck is not null)
        {
            plant = buck with { PowerStage = stage! with { OutputCapacitors = [.. caps!] }, Control = control!, Feedback = feedback! };
        }

        return design with { Plant = plant, Compensator = compensator };
    }

    private static (Compensator, FeedbackDivider?) WithPart(Compensator c, FeedbackDivider? feedback, ToleranceParameter p, double v)
    {
        switch (c)
        {
            case OpAmpNetwork n:
                return p.Name switch
                {
                    "R1" => (n with { R1Ohm = v }, feedback is null ? null : feedback with { TopOhm = v }),
                    "R2" => (n with { R2Ohm = v }, feedback),
                    "R3" => (n with { R3Ohm = v }, feedback),
                    "C1" => (n with { C1F = v }, feedback),
                    "C2" => (n with { C2F = v }, feedback),
                    "C3" => (n with { C3F = v }, feedback),
                    "R4" => (n.RBottomOhm > 0 ? n with { RBottomOhm = v } : n, feedback is null ? null : feedback with { BottomOhm = v }),
                    _ => (n, feedback),
                };
            case TransconductanceNetwork g:
                return p.Name switch
                {
                    "R1" => (g, feedback! with { TopOhm = v }),
                    "R4" => (g, feedback! with { BottomOhm = v }),
                    "R2" => (g with { R2Ohm = v }, feedback),
                    "C1" => (g with { C1F = v }, feedback),
                    "C2" => (g with { C2F = v }, feedback),
                    _ => (g, feedback),
                };
            default:
                return (c, feedback);
        }
    }

    private static ToleranceParameter Band(string name, string path, ToleranceKind kind, int branch, double value, double pct, double nominal)
        => new(name, path, kind, branch, value, nominal, nominal * (1 - (pct / 100.0)), nominal * (1 + (pct / 100.0)));
}
