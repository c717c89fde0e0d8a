using System.Collections.Immutable;
using System.Globalization;
using System.Text.Json;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;
using static LoopShaper.Core.Design.DesignFileWords;

namespace LoopShaper.Core.Design;

/// <summary>
/// Reads a design file (docs/design-file.md) into a <see cref="LoopDesign"/>: syntax, types, units, required and
/// unknown fields. Range checks are <see cref="DesignValidator"/>'s job.
/// </summary>
internal static class DesignFileReader
{
    private static readonly JsonDocumentOptions Options = new() { CommentHandling = JsonCommentHandling.Skip, MaxDepth = 64 };

    public static DesignFileResult Read(string? json)
    {
        var errors = new List<ValidationIssue>();
        if (string.IsNullOrWhiteSpace(json))
        {
            return Fail("$", $"the file is empty: a design file is a JSON object with \"format\": \"{DesignFile.FormatName}\".");
        }

        JsonDocument doc;
        try
        {
            doc = JsonDocument.Parse(json, Options);
        }
        catch (JsonException ex)
        {
            return Fail("$", SyntaxMessage(ex));
        }

        using (doc)
        {
            var root = JsonFieldReader.Open(doc.RootElement, "$", errors);
            if (!root.IsObject || !ReadHeader(root, errors, out int version))
            {
                return new DesignFileResult(null, [.. errors]);
            }

            string name = root.Text("name");
            string description = root.Text("description", string.Empty);
            var plant = ReadPlant(root.Object("plant"), version);
            var compensator = ReadCompensator(root.Object("compensator"), version);
            var analysisFields = root.OptionalObject("analysis");
            var analysis = analysisFields is null ? new AnalysisSettings() : ReadAnalysis(analysisFields, version);
            var criteriaFields = root.OptionalObject("criteria");
            var criteria = criteriaFields is null ? new DesignCriteria() : ReadCriteria(criteriaFields);
            root.NeedsVersion("synthesis", version, 2);
            var synthesisFields = root.OptionalObject("synthesis");
            var synthesis = synthesisFields is null ? null : SynthesisSectionReader.Read(synthesisFields);
            root.NeedsVersion("tolerances", version, 2);
            var tolerancesFields = root.OptionalObject("tolerances");
            var tolerances = tolerancesFields is null ? null : TolerancesSectionReader.Read(tolerancesFields);
            root.Finish("a design file");
            if (errors.Count > 0 || plant is null || compensator is null)
            {
                return new DesignFileResult(null, [.. errors]);
            }

            return new DesignFileResult(new LoopDesign(name, description, plant, compensator, analysis, criteria, synthesis, tolerances), []);
        }
    }

    private static DesignFileResult Fail(string path, string message) => new(null, [new ValidationIssue(path, message)]);

    /// <summary>"format" and "version" first: a file of another format or a newer version is not read further.</summary>
    private static bool ReadHeader(JsonFieldReader root, List<ValidationIssue> errors, out int fileVersion)
    {
        fileVersion = DesignFile.CurrentVersion;
        int before = errors.Count;
        string format = root.Text("format");
        if (errors.Count == before && format != DesignFile.FormatName)
        {
            errors.Add(new ValidationIssue("$.format", $"\"{format}\" is not a LoopShaper design file: expected \"{DesignFile.FormatName}\"."));
        }

        int countAfterFormat = errors.Count;
        int version = root.Integer("version");
        if (errors.Count == countAfterFormat && (version > DesignFile.CurrentVersion || version < DesignFile.OldestVersion))
        {
            errors.Add(new ValidationIssue("$.version", version > DesignFile.CurrentVersion
                ? $"version {version} is newer than this program reads: it reads versions {DesignFile.OldestVersion} to {DesignFile.CurrentVersion}."
                : $"version {version} does not exist: the versions are {DesignFile.OldestVersion} to {DesignFile.CurrentVersion}."));
        }

        fileVersion = version;
        return errors.Count == before;
    }

    /// <summary>The message of a JSON syntax error with a 1-based line and column.</summary>
    private static string SyntaxMessage(JsonException ex)
    {
        string text = ex.Message;
        foreach (string tail in new[] { " Path:", " LineNumber:" })
        {
            int cut = text.IndexOf(tail, StringComparison.Ordinal);
            if (cut >= 0)
            {
                text = text[..cut];
            }
        }

        long line = (ex.LineNumber ?? 0) + 1;
        long column = (ex.BytePositionInLine ?? 0) + 1;
        return string.Create(CultureInfo.InvariantCulture, $"JSON syntax error at line {line}, column {column}: {text.Trim()}");
    }

    private static Plant? ReadPlant(JsonFieldReader p, int version)
    {
        var model = p.Word("model", PlantModelWords);
        switch (model)
        {
            case PlantModel.Buck:
                var plant = new BuckPlant(ReadPowerStage(p.Object("powerStage")), ReadControl(p.Object("control"), version), ReadFeedback(p.Object("feedback")));
                p.Finish("a buck plant");
                return plant;
            case PlantModel.Custom:
                var custom = ReadCustom(p);
                p.Finish("a custom plant");
                return custom;
            default:
                p.AcceptAll();
                return null;
        }
    }

    private static BuckPowerStage ReadPowerStage(JsonFieldReader s)
    {
        var vin = s.Object("inputVoltageV");
        var inputVoltage = new VoltageRange(vin.Number("min", "V"), vin.Number("nominal", "V"), vin.Number("max", "V"));
        vin.Finish("the input voltage");
        double vout = s.Number("outputVoltageV", "V");
        var load = s.Object("loadCurrentA");
        var loadCurrent = new CurrentRange(load.Number("min", "A"), load.Number("max", "A"), load.NullableNumber("nominal", "A"));
        load.Finish("the load current");
        double fs = s.Number("switchingFrequencyHz", "Hz");
        var l = s.Object("inductor");
        var inductor = new Inductor(l.Number("inductanceH", "H"), l.Number("dcrOhm", "Ohm"));
        l.Finish("the inductor");
        var capacitors = s.Array("outputCapacitors", required: true).Select(item => ReadCapacitor(s.OpenItem(item.Item, item.Path))).ToImmutableArray();
        double rHigh = s.Number("highSideOnResistanceOhm", "Ohm");
        var r = s.Object("rectifier");
        var rectifier = new Rectifier(r.Word("kind", RectifierKinds) ?? RectifierKind.Synchronous, r.Number("onResistanceOhm", "Ohm"), r.Number("forwardDropV", "V", 0.0));
        r.Finish("the rectifier");
        double maxDuty = s.Number("maxDutyCycle", string.Empty, 0.95);
        s.Finish("the power stage");
        return new BuckPowerStage(inputVoltage, vout, loadCurrent, fs, inductor, capacitors, rHigh, rectifier, maxDuty);
    }

    private static CapacitorBranch ReadCapacitor(JsonFieldReader c)
    {
        var branch = new CapacitorBranch(c.Text("label"), c.Integer("count"), c.Number("capacitanceF", "F"), c.Number("esrOhm", "Ohm"), c.Number("eslH", "H", 0.0));
        c.Finish("a capacitor branch");
        return branch;
    }

    private static PwmControl ReadControl(JsonFieldReader k, int version)
    {
        var scheme = k.Word("scheme", ControlSchemes, ControlScheme.VoltageMode);
        k.NeedsVersion("modulatorDelayFractionOfPeriod", version, 2);
        double delay = k.Number("modulatorDelayS", "s", 0.0);
        double fraction = k.Number("modulatorDelayFractionOfPeriod", string.Empty, 0.0);
        if (scheme == ControlScheme.PeakCurrentMode)
        {
            k.NeedsVersion("scheme", version, 2);
            double ri = k.Number("senseGainOhm", "Ohm");
            var rampFields = k.OptionalObject("ramp");
            var ramp = CompensationRamp.None;
            if (rampFields is not null)
            {
                var kind = rampFields.Word("kind", RampKinds);
                double value = kind is CompensationRampKind rk ? rampFields.Number("value", rk == CompensationRampKind.VoltsPerSecond ? "V/s" : string.Empty) : double.NaN;
                if (kind is null)
                {
                    rampFields.Has("value");
                }

                rampFields.Finish("the compensation ramp");
                ramp = new CompensationRamp(kind ?? CompensationRampKind.VoltsPerSecond, value);
            }

            k.Finish("the peak current-mode control");
            return new PeakCurrentModeControl(ri, ramp, delay, fraction);
        }

        bool feedforward = k.Boolean("inputFeedforward", false);
        double rampV = feedforward ? k.Number("rampAmplitudeV", "V", 0.0) : k.Number("rampAmplitudeV", "V");
        double perVolt = feedforward ? k.Number("feedforwardRampPerVolt", "V/V") : k.Number("feedforwardRampPerVolt", "V/V", 0.0);
        var control = new VoltageModeControl(rampV, feedforward, perVolt, delay, fraction);
        k.Finish("the voltage-mode control");
        return control;
    }

    private static FeedbackDivider ReadFeedback(JsonFieldReader f)
    {
        var divider = new FeedbackDivider(f.Number("topOhm", "Ohm"), f.Number("bottomOhm", "Ohm"), f.Number("referenceV", "V"));
        f.Finish("the feedback divider");
        return divider;
    }

    private static CustomPlant ReadCustom(JsonFieldReader p)
    {
        var form = p.Word("form", CustomPlantForms);
        bool coefficients = form == CustomPlantForm.Coefficients;
        bool factors = form == CustomPlantForm.Factors;
        var numerator = Numbers(p, "numerator", coefficients);
        var denominator = Numbers(p, "denominator", coefficients);
        double gain = factors ? p.Number("gain", string.Empty) : p.Number("gain", string.Empty, 1.0);
        int originOrder = p.Integer("originOrder", 0);
        var zeros = Factors(p, "zeros");
        var poles = Factors(p, "poles");
        return new CustomPlant(
            form ?? CustomPlantForm.Factors,
            numerator,
            denominator,
            gain,
            originOrder,
            zeros,
            poles,
            p.Number("delayS", "s", 0.0),
            p.Number("dividerRatio", string.Empty, 1.0),
            p.NullableNumber("switchingFrequencyHz", "Hz"));
    }

    private static ImmutableArray<double> Numbers(JsonFieldReader p, string name, bool required)
        => [.. p.Array(name, required).Select(item => p.ParseNumber(item.Item, item.Path, string.Empty) ?? double.NaN)];

    private static ImmutableArray<Factor> Factors(JsonFieldReader p, string name)
        => [.. p.Array(name, required: false).Select(item =>
        {
            var f = p.OpenItem(item.Item, item.Path);
            var factor = new Factor(f.Number("frequencyHz", "Hz"), f.NullableNumber("q", string.Empty), f.Boolean("rightHalfPlane", false));
            f.Finish("a zero or pole");
            return factor;
        })];

    private static Compensator? ReadCompensator(JsonFieldReader c, int version)
    {
        var form = c.Word("form", CompensatorForms);
        var type = c.Word("type", CompensatorTypes);
        string because = type is CompensatorType t ? $"for a {WordOf(CompensatorTypes, t)} compensator" : string.Empty;
        bool two = type is CompensatorType.TypeII or CompensatorType.TypeIII;
        bool three = type is CompensatorType.TypeIII;
        switch (form)
        {
            case CompensatorForm.Placement:
                var g = c.Object("gain");
                var kind = g.Word("kind", GainKinds);
                double value = double.NaN;
                if (kind is GainSettingKind k)
                {
                    value = g.Number("value", k == GainSettingKind.MidbandGainDb ? "dB" : "Hz");
                }
                else
                {
                    // Without a valid kind the value's unit is unknown: it is checked once the kind is fixed.
                    g.Has("value");
                }

                g.Finish("the compensator gain");
                var placement = new CompensatorPlacement(
                    type ?? CompensatorType.TypeI,
                    new GainSetting(kind ?? GainSettingKind.IntegratorHz, value),
                    c.NullableNumber("zero1Hz", "Hz", two ? because : null),
                    c.NullableNumber("zero2Hz", "Hz", three ? because : null),
                    c.NullableNumber("pole1Hz", "Hz", two ? because : null),
                    c.NullableNumber("pole2Hz", "Hz", three ? because : null));
                c.Finish("a placement compensator");
                return type is null || kind is null ? null : placement;
            case CompensatorForm.OpAmpNetwork:
                var network = new OpAmpNetwork(
                    type ?? CompensatorType.TypeI,
                    R1Ohm: c.Number("r1Ohm", "Ohm"),
                    C1F: c.Number("c1F", "F"),
                    R2Ohm: Part(c, "r2Ohm", "Ohm", two, because),
                    C2F: Part(c, "c2F", "F", two, because),
                    R3Ohm: Part(c, "r3Ohm", "Ohm", three, because),
                    C3F: Part(c, "c3F", "F", three, because),
                    RBottomOhm: c.Number("rBottomOhm", "Ohm", 0.0),
                    Amplifier: ReadOpAmp(c, version));
                c.Finish("an op-amp network compensator");
                return type is null ? null : network;
            case CompensatorForm.Ota:
                c.NeedsVersion("form", version, 2);
                var a = c.Object("amplifier");
                var amplifier = new Transconductance(a.Number("transconductanceS", "S"), a.Number("outputResistanceOhm", "Ohm"));
                a.Finish("the transconductance amplifier");
                var ota = new TransconductanceNetwork(type ?? CompensatorType.TypeII, amplifier, c.Number("c1F", "F"), Part(c, "r2Ohm", "Ohm", two, because), Part(c, "c2F", "F", two, because));
                c.Finish("a transconductance compensator");
                return type is null ? null : ota;
            default:
                c.AcceptAll();
                return null;
        }
    }

    /// <summary>compensator.amplifier of an op-amp network: absent or kind "ideal" for an ideal op-amp (version 2).</summary>
    private static ErrorAmplifier? ReadOpAmp(JsonFieldReader c, int version)
    {
        c.NeedsVersion("amplifier", version, 2);
        var a = c.OptionalObject("amplifier");
        if (a is null)
        {
            return null;
        }

        var kind = a.Word("kind", AmplifierKinds);
        if (kind != AmplifierKind.OpAmp)
        {
            if (kind is null)
            {
                a.AcceptAll();
            }

            a.Finish("an ideal op-amp");
            return kind is null ? null : IdealOpAmp.Instance;
        }

        var opAmp = new OpAmp(a.Number("openLoopGain", "V/V"), a.Number("gainBandwidthHz", "Hz"), a.NullableNumber("secondPoleHz", "Hz"));
        a.Finish("an op-amp");
        return opAmp;
    }

    /// <summary>A part of the op-amp network: required when the type uses it, zero otherwise.</summary>
    private static double Part(JsonFieldReader c, string name, string unit, bool required, string because)
        => required ? c.NullableNumber(name, unit, because) ?? double.NaN : c.Number(name, unit, 0.0);

    private static AnalysisSettings ReadAnalysis(JsonFieldReader a, int version)
    {
        a.NeedsVersion("conductionModel", version, 2);
        var d = new AnalysisSettings();
        var settings = new AnalysisSettings(
            a.Number("startHz", "Hz", d.StartHz),
            a.Number("stopHz", "Hz", d.StopHz),
            a.Integer("points", d.Points),
            a.Word("input", InputCorners, d.Input),
            a.Word("load", LoadCorners, d.Load),
            a.Number("loadStepA", "A", d.LoadStepA),
            a.Number("loadStepSlewAPerS", "A/s", d.LoadStepSlewAPerS),
            a.Number("referenceStepV", "V", d.ReferenceStepV),
            a.NullableNumber("stepDurationS", "s"),
            a.Integer("stepSamples", d.StepSamples),
            a.Word("conductionModel", ConductionModels, d.ConductionModel));
        a.Finish("the analysis settings");
        return settings;
    }

    private static DesignCriteria ReadCriteria(JsonFieldReader k)
    {
        var d = new DesignCriteria();
        var criteria = new DesignCriteria(
            k.Number("minPhaseMarginDeg", "deg", d.MinPhaseMarginDeg),
            k.Number("minGainMarginDb", "dB", d.MinGainMarginDb),
            k.Number("maxCrossoverFractionOfSwitching", string.Empty, d.MaxCrossoverFractionOfSwitching),
            k.Number("minCrossoverHz", "Hz", d.MinCrossoverHz),
            k.NullableNumber("maxOvershootPct", "%"),
            k.NullableNumber("maxLoadStepDeviationV", "V"),
            k.Number("minRippleFraction", string.Empty, d.MinRippleFraction),
            k.Number("maxRippleFraction", string.Empty, d.MaxRippleFraction));
        k.Finish("the design criteria");
        return criteria;
    }
}
