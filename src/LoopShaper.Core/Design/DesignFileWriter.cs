using System.Buffers;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Corners;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Design.DesignFileWords;

namespace LoopShaper.Core.Design;

/// <summary>
/// Writes a <see cref="LoopDesign"/> as a design file (docs/design-file.md): every field, numbers in SI base units in
/// their shortest round-trip form, so that reading the text back gives the same values.
/// </summary>
internal sealed class DesignFileWriter
{
    private static readonly JsonWriterOptions Options = new()
    {
        Indented = true,
        NewLine = "\n",
        // The file is not embedded in HTML: keep µ, Ω and quotes in labels readable.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    private readonly Utf8JsonWriter _w;
    private readonly Stack<string> _path = new();

    private DesignFileWriter(Utf8JsonWriter writer) => _w = writer;

    public static string Write(LoopDesign design)
    {
        ArgumentNullException.ThrowIfNull(design);
        var buffer = new ArrayBufferWriter<byte>();
        using (var json = new Utf8JsonWriter(buffer, Options))
        {
            new DesignFileWriter(json).Design(design);
        }

        return Encoding.UTF8.GetString(buffer.WrittenSpan) + "\n";
    }

    private void Design(LoopDesign d)
    {
        _w.WriteStartObject();
        _w.WriteString("format", DesignFile.FormatName);
        _w.WriteNumber("version", DesignFile.CurrentVersion);
        _w.WriteString("name", d.Name);
        _w.WriteString("description", d.Description);
        Object("plant", () => Plant(d.Plant));
        Object("compensator", () => Compensator(d.Compensator));
        Object("analysis", () => Analysis(d.Analysis));
        Object("criteria", () => Criteria(d.Criteria));
        if (d.Synthesis is { } synthesis)
        {
            Object("synthesis", () => Synthesis(synthesis));
        }

        if (d.Tolerances is { } tolerances)
        {
            Object("tolerances", () => Tolerances(tolerances));
        }

        _w.WriteEndObject();
    }

    private void Plant(Plant plant)
    {
        switch (plant)
        {
            case BuckPlant b:
                _w.WriteString("model", WordOf(PlantModelWords, PlantModel.Buck));
                Object("powerStage", () => PowerStage(b.PowerStage));
                Object("control", () => Control(b.Control));
                Object("feedback", () =>
                {
                    Number("topOhm", b.Feedback.TopOhm);
                    Number("bottomOhm", b.Feedback.BottomOhm);
                    Number("referenceV", b.Feedback.ReferenceV);
                });
                break;
            case CustomPlant c:
                _w.WriteString("model", WordOf(PlantModelWords, PlantModel.Custom));
                Custom(c);
                break;
            default:
                throw new ArgumentException($"The plant kind {plant.GetType().Name} has no design-file form.", nameof(plant));
        }
    }

    private void PowerStage(BuckPowerStage s)
    {
        Object("inputVoltageV", () =>
        {
            Number("min", s.InputVoltage.MinV);
            Number("nominal", s.InputVoltage.NominalV);
            Number("max", s.InputVoltage.MaxV);
        });
        Number("outputVoltageV", s.OutputVoltageV);
        Object("loadCurrentA", () =>
        {
            Number("min", s.LoadCurrent.MinA);
            if (s.LoadCurrent.NominalA is double nominal)
            {
                Number("nominal", nominal);
            }

            Number("max", s.LoadCurrent.MaxA);
        });
        Number("switchingFrequencyHz", s.SwitchingFrequencyHz);
        Object("inductor", () =>
        {
            Number("inductanceH", s.Inductor.InductanceH);
            Number("dcrOhm", s.Inductor.DcrOhm);
        });
        Array("outputCapacitors", s.OutputCapacitors.IsDefault ? [] : s.OutputCapacitors, c =>
        {
            _w.WriteString("label", c.Label);
            _w.WriteNumber("count", c.Count);
            Number("capacitanceF", c.CapacitanceF);
            Number("esrOhm", c.EsrOhm);
            Number("eslH", c.EslH);
        });
        Number("highSideOnResistanceOhm", s.HighSideOnResistanceOhm);
        Object("rectifier", () =>
        {
            _w.WriteString("kind", WordOf(RectifierKinds, s.Rectifier.Kind));
            Number("onResistanceOhm", s.Rectifier.OnResistanceOhm);
            Number("forwardDropV", s.Rectifier.ForwardDropV);
        });
        Number("maxDutyCycle", s.MaxDutyCycle);
    }

    private void Control(PwmControl control)
    {
        switch (control)
        {
            case VoltageModeControl k:
                _w.WriteString("scheme", WordOf(ControlSchemes, ControlScheme.VoltageMode));
                Number("rampAmplitudeV", k.RampAmplitudeV);
                _w.WriteBoolean("inputFeedforward", k.InputFeedforward);
                Number("feedforwardRampPerVolt", k.FeedforwardRampPerVolt);
                break;
            case PeakCurrentModeControl p:
                _w.WriteString("scheme", WordOf(ControlSchemes, ControlScheme.PeakCurrentMode));
                Number("senseGainOhm", p.SenseGainOhm);
                Object("ramp", () =>
                {
                    _w.WriteString("kind", WordOf(RampKinds, p.Ramp.Kind));
                    Number("value", p.Ramp.Value);
                });
                break;
            default:
                throw new ArgumentException($"The control scheme {control.GetType().Name} has no design-file form.", nameof(control));
        }

        Number("modulatorDelayS", control.ModulatorDelayS);
        Number("modulatorDelayFractionOfPeriod", control.ModulatorDelayFractionOfPeriod);
    }

    /// <summary>The fields of the other form are written only when they differ from what the reader assumes when they are absent.</summary>
    private void Custom(CustomPlant c)
    {
        bool coefficients = c.Form == CustomPlantForm.Coefficients;
        _w.WriteString("form", WordOf(CustomPlantForms, c.Form));
        var numerator = c.NumeratorDescending.IsDefault ? [] : c.NumeratorDescending;
        var denominator = c.DenominatorDescending.IsDefault ? [] : c.DenominatorDescending;
        var zeros = c.Zeros.IsDefault ? [] : c.Zeros;
        var poles = c.Poles.IsDefault ? [] : c.Poles;
        if (coefficients || !numerator.IsEmpty)
        {
            Numbers("numerator", numerator);
        }

        if (coefficients || !denominator.IsEmpty)
        {
            Numbers("denominator", denominator);
        }

        if (!coefficients || c.Gain != 1.0)
        {
            Number("gain", c.Gain);
        }

        if (!coefficients || c.OriginOrder != 0)
        {
            _w.WriteNumber("originOrder", c.OriginOrder);
        }

        if (!coefficients || !zeros.IsEmpty)
        {
            Array("zeros", zeros, Factor);
        }

        if (!coefficients || !poles.IsEmpty)
        {
            Array("poles", poles, Factor);
        }

        Number("delayS", c.DelayS);
        Number("dividerRatio", c.DividerRatio);
        NullableNumber("switchingFrequencyHz", c.SwitchingFrequencyHz);
    }

    private void Factor(Factor f)
    {
        Number("frequencyHz", f.FrequencyHz);
        NullableNumber("q", f.Q);
        _w.WriteBoolean("rightHalfPlane", f.RightHalfPlane);
    }

    private void Compensator(Compensator compensator)
    {
        switch (compensator)
        {
            case CompensatorPlacement p:
                _w.WriteString("form", WordOf(CompensatorForms, CompensatorForm.Placement));
                _w.WriteString("type", WordOf(CompensatorTypes, p.Type));
                Object("gain", () =>
                {
                    _w.WriteString("kind", WordOf(GainKinds, p.Gain.Kind));
                    Number("value", p.Gain.Value);
                });
                NullableNumber("zero1Hz", p.Zero1Hz);
                NullableNumber("zero2Hz", p.Zero2Hz);
                NullableNumber("pole1Hz", p.Pole1Hz);
                NullableNumber("pole2Hz", p.Pole2Hz);
                break;
            case OpAmpNetwork n:
                _w.WriteString("form", WordOf(CompensatorForms, CompensatorForm.OpAmpNetwork));
                _w.WriteString("type", WordOf(CompensatorTypes, n.Type));
                Number("r1Ohm", n.R1Ohm);
                Number("c1F", n.C1F);
                Number("r2Ohm", n.R2Ohm);
                Number("c2F", n.C2F);
                Number("r3Ohm", n.R3Ohm);
                Number("c3F", n.C3F);
                Number("rBottomOhm", n.RBottomOhm);
                switch (n.Amplifier)
                {
                    case OpAmp a:
                        Object("amplifier", () =>
                        {
                            _w.WriteString("kind", WordOf(AmplifierKinds, AmplifierKind.OpAmp));
                            Number("openLoopGain", a.OpenLoopGain);
                            Number("gainBandwidthHz", a.GainBandwidthHz);
                            NullableNumber("secondPoleHz", a.SecondPoleHz);
                        });
                        break;
                    case IdealOpAmp:
                        Object("amplifier", () => _w.WriteString("kind", WordOf(AmplifierKinds, AmplifierKind.Ideal)));
                        break;
                    case Transconductance:
                        throw new ArgumentException("An op-amp network cannot carry a transconductance amplifier: use a TransconductanceNetwork.", nameof(compensator));
                }

                break;
            case TransconductanceNetwork g:
                _w.WriteString("form", WordOf(CompensatorForms, CompensatorForm.Ota));
                _w.WriteString("type", WordOf(CompensatorTypes, g.Type));
                Object("amplifier", () =>
                {
                    Number("transconductanceS", g.Amplifier.TransconductanceS);
                    Number("outputResistanceOhm", g.Amplifier.OutputResistanceOhm);
                });
                Number("c1F", g.C1F);
                Number("r2Ohm", g.R2Ohm);
                Number("c2F", g.C2F);
                break;
            default:
                throw new ArgumentException($"The compensator kind {compensator.GetType().Name} has no design-file form.", nameof(compensator));
        }
    }

    private void Analysis(AnalysisSettings a)
    {
        Number("startHz", a.StartHz);
        Number("stopHz", a.StopHz);
        _w.WriteNumber("points", a.Points);
        _w.WriteString("input", WordOf(InputCorners, a.Input));
        _w.WriteString("load", WordOf(LoadCorners, a.Load));
        Number("loadStepA", a.LoadStepA);
        Number("loadStepSlewAPerS", a.LoadStepSlewAPerS);
        Number("referenceStepV", a.ReferenceStepV);
        NullableNumber("stepDurationS", a.StepDurationS);
        _w.WriteNumber("stepSamples", a.StepSamples);
        _w.WriteString("conductionModel", WordOf(ConductionModels, a.ConductionModel));
    }

    private void Criteria(DesignCriteria k)
    {
        Number("minPhaseMarginDeg", k.MinPhaseMarginDeg);
        Number("minGainMarginDb", k.MinGainMarginDb);
        Number("maxCrossoverFractionOfSwitching", k.MaxCrossoverFractionOfSwitching);
        Number("minCrossoverHz", k.MinCrossoverHz);
        NullableNumber("maxOvershootPct", k.MaxOvershootPct);
        NullableNumber("maxLoadStepDeviationV", k.MaxLoadStepDeviationV);
        Number("minRippleFraction", k.MinRippleFraction);
        Number("maxRippleFraction", k.MaxRippleFraction);
    }

    private void Synthesis(SynthesisSettings s)
    {
        NullableNumber("r1Ohm", s.R1Ohm);
        _w.WriteString("resistorSeries", s.ResistorSeries.ToString());
        _w.WriteString("capacitorSeries", s.CapacitorSeries.ToString());
        Number("resistorTolerancePct", s.ResistorTolerancePct);
        Number("capacitorTolerancePct", s.CapacitorTolerancePct);
        Object("tolerances", () =>
        {
            foreach (var (designator, pct) in s.TolerancesPct)
            {
                Number(designator, pct);
            }
        });
        _w.WriteBoolean("searchNeighbours", s.SearchNeighbours);
        _w.WriteNumber("searchSteps", s.SearchSteps);
    }

    private void Tolerances(ToleranceSpec t)
    {
        Number("inductancePct", t.InductancePct);
        Number("capacitancePct", t.CapacitancePct);
        Number("dcBiasFactor", t.DcBiasFactor);
        Array("capacitors", t.Capacitors, c =>
        {
            _w.WriteString("label", c.Key);
            Number("tolerancePct", c.Value.TolerancePct);
            Number("dcBiasFactor", c.Value.DcBiasFactor);
        });
        Number("esrLowFactor", t.EsrLowFactor);
        Number("esrHighFactor", t.EsrHighFactor);
        Number("dcrLowFactor", t.DcrLowFactor);
        Number("dcrHighFactor", t.DcrHighFactor);
        Number("senseGainPct", t.SenseGainPct);
        Number("rampPct", t.RampPct);
        Number("transconductancePct", t.TransconductancePct);
    }

    private void Object(string name, Action body)
    {
        _path.Push(name);
        _w.WriteStartObject(name);
        body();
        _w.WriteEndObject();
        _path.Pop();
    }

    private void Array<T>(string name, IEnumerable<T> items, Action<T> item)
    {
        _w.WriteStartArray(name);
        int i = 0;
        foreach (var x in items)
        {
            _path.Push($"{name}[{i++}]");
            _w.WriteStartObject();
            item(x);
            _w.WriteEndObject();
            _path.Pop();
        }

        _w.WriteEndArray();
    }

    private void Numbers(string name, IEnumerable<double> values)
    {
        _w.WriteStartArray(name);
        int i = 0;
        foreach (double v in values)
        {
            Finite($"{name}[{i++}]", v);
            _w.WriteNumberValue(v);
        }

        _w.WriteEndArray();
    }

    private void Number(string name, double value)
    {
        Finite(name, value);
        _w.WriteNumber(name, value);
    }

    /// <summary>Absent values are left out: the reader takes a missing field as null.</summary>
    private void NullableNumber(string name, double? value)
    {
        if (value is double v)
        {
            Number(name, v);
        }
    }

    private void Finite(string name, double value)
    {
        if (!double.IsFinite(value))
        {
            string path = string.Join(".", _path.Reverse().Prepend("$").Append(name));
            throw new ArgumentException($"{path} is {value}: a design file holds finite numbers only.", nameof(value));
        }
    }
}
