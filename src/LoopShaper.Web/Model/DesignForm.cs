using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Web.Model;

/// <summary>
/// The state of the whole input form: every numeric field keeps its raw text (see <see cref="FieldState"/>), choices
/// are plain properties. <see cref="Build"/> turns the last readable values into a <see cref="LoopDesign"/> for the
/// core; no engineering figure is computed here.
/// </summary>
public sealed class DesignForm
{
    private const string Stage = "plant.powerStage";
    private const string Control = "plant.control";
    private const string Feedback = "plant.feedback";
    private const string Comp = "compensator";
    private const string Run = "analysis";
    private const string Crit = "criteria";
    private const string Parts = "synthesis";

    private readonly SynthesisSettings? _synthesis;

    // An ideal op-amp named in the file is kept as written, so that saving gives the file back.
    private readonly IdealOpAmp? _idealAmplifier;

    private DesignForm(LoopDesign design)
    {
        Name = design.Name;
        Description = design.Description;
        var buck = design.Plant as BuckPlant;
        CustomPlant = design.Plant as CustomPlant;

        // A custom plant has no power stage: the demo's values stand in for the hidden power-stage fields.
        var shown = buck ?? (BuckPlant)DemoDesign.Create().Plant;
        var s = shown.PowerStage;
        // Each scheme's fields start from the design's values, or from defaults when the design uses the other scheme.
        var m = shown.Control as VoltageModeControl ?? (VoltageModeControl)((BuckPlant)DemoDesign.Create().Plant).Control;
        var pcm = shown.Control as PeakCurrentModeControl ?? new PeakCurrentModeControl(0.1, new CompensationRamp(CompensationRampKind.MultipleOfOffSlope, 0.5));
        var f = shown.Feedback;

        InputMin = new($"{Stage}.inputVoltageV.min", "Input, minimum", "V", s.InputVoltage.MinV);
        InputNominal = new($"{Stage}.inputVoltageV.nominal", "Input, nominal", "V", s.InputVoltage.NominalV);
        InputMax = new($"{Stage}.inputVoltageV.max", "Input, maximum", "V", s.InputVoltage.MaxV);
        OutputVoltage = new($"{Stage}.outputVoltageV", "Output voltage", "V", s.OutputVoltageV);
        LoadMin = new($"{Stage}.loadCurrentA.min", "Load, lightest", "A", s.LoadCurrent.MinA);
        LoadMax = new($"{Stage}.loadCurrentA.max", "Load, full", "A", s.LoadCurrent.MaxA);
        SwitchingFrequency = new($"{Stage}.switchingFrequencyHz", "Switching frequency", "Hz", s.SwitchingFrequencyHz);
        Inductance = new($"{Stage}.inductor.inductanceH", "Inductance", "H", s.Inductor.InductanceH);
        InductorDcr = new($"{Stage}.inductor.dcrOhm", "Winding resistance (DCR)", "Ohm", s.Inductor.DcrOhm, "Ω");
        HighSideOn = new($"{Stage}.highSideOnResistanceOhm", "High-side on-resistance", "Ohm", s.HighSideOnResistanceOhm, "Ω");
        Rectifier = s.Rectifier.Kind;
        RectifierOn = new($"{Stage}.rectifier.onResistanceOhm", "Low-side resistance", "Ohm", s.Rectifier.OnResistanceOhm, "Ω");
        ForwardDrop = new($"{Stage}.rectifier.forwardDropV", "Diode forward drop", "V", s.Rectifier.ForwardDropV);
        MaxDutyCycle = new($"{Stage}.maxDutyCycle", "Largest duty cycle", string.Empty, s.MaxDutyCycle, "0..1");
        Capacitors = [.. s.OutputCapacitors.Select((b, i) => new CapacitorBranchForm(i, b))];

        InputFeedforward = m.InputFeedforward;
        RampAmplitude = new($"{Control}.rampAmplitudeV", "Ramp amplitude Vm", "V", m.RampAmplitudeV);
        FeedforwardRamp = new($"{Control}.feedforwardRampPerVolt", "Ramp per input volt k", string.Empty, m.FeedforwardRampPerVolt, "V/V");
        Scheme = shown.Control is PeakCurrentModeControl ? ControlScheme.PeakCurrentMode : ControlScheme.VoltageMode;
        SenseGain = new($"{Control}.senseGainOhm", "Current-sense gain Ri", "Ohm", pcm.SenseGainOhm, "Ω");
        RampKind = pcm.Ramp.Kind;
        RampValue = new($"{Control}.ramp.value", "Compensation ramp", RampUnit(RampKind), pcm.Ramp.Value, RampDisplayUnit(RampKind));
        ModulatorDelay = new($"{Control}.modulatorDelayS", "Modulator delay", "s", shown.Control.ModulatorDelayS);
        ModulatorDelayFraction = new($"{Control}.modulatorDelayFractionOfPeriod", "Delay, fraction of the period", string.Empty, shown.Control.ModulatorDelayFractionOfPeriod, "× Ts");
        DividerTop = new($"{Feedback}.topOhm", "Divider, top", "Ohm", f.TopOhm, "Ω");
        DividerBottom = new($"{Feedback}.bottomOhm", "Divider, bottom", "Ohm", f.BottomOhm, "Ω");
        Reference = new($"{Feedback}.referenceV", "Reference", "V", f.ReferenceV);

        var placement = design.Compensator as CompensatorPlacement;
        var parts = design.Compensator as OpAmpNetwork;
        var ota = design.Compensator as TransconductanceNetwork;
        Mode = ota is not null ? CompensatorMode.Transconductance : parts is null ? CompensatorMode.Placement : CompensatorMode.Parts;
        var opAmp = parts?.Amplifier as OpAmp;
        RealOpAmp = opAmp is not null;
        _idealAmplifier = parts?.Amplifier as IdealOpAmp;
        OpenLoopGain = new($"{Comp}.amplifier.openLoopGain", "Open-loop gain A0", string.Empty, opAmp?.OpenLoopGain ?? 1e5, "V/V");
        GainBandwidth = new($"{Comp}.amplifier.gainBandwidthHz", "Gain-bandwidth", "Hz", opAmp?.GainBandwidthHz ?? 10e6);
        SecondPole = new($"{Comp}.amplifier.secondPoleHz", "Second pole (empty: none)", "Hz", opAmp?.SecondPoleHz, optional: true);
        Transconductance = new($"{Comp}.amplifier.transconductanceS", "Transconductance gm", "S", ota?.Amplifier.TransconductanceS ?? 1e-3);
        OtaOutputResistance = new($"{Comp}.amplifier.outputResistanceOhm", "Output resistance", "Ohm", ota?.Amplifier.OutputResistanceOhm ?? 5e6, "Ω");
        CompensatorType = design.Compensator.Type;
        GainKind = placement?.Gain.Kind ?? GainSettingKind.CrossoverHz;
        GainValue = new($"{Comp}.gain.value", "Gain setting", GainUnit(GainKind), placement?.Gain.Value ?? 0.1 * s.SwitchingFrequencyHz);
        Zero1 = new($"{Comp}.zero1Hz", "Zero 1", "Hz", placement?.Zero1Hz ?? parts?.ToPlacement().Zero1Hz ?? ota?.ToPlacement().Zero1Hz);
        Zero2 = new($"{Comp}.zero2Hz", "Zero 2", "Hz", placement?.Zero2Hz ?? parts?.ToPlacement().Zero2Hz);
        Pole1 = new($"{Comp}.pole1Hz", "Pole 1", "Hz", placement?.Pole1Hz ?? parts?.ToPlacement().Pole1Hz ?? ota?.ToPlacement().Pole1Hz);
        Pole2 = new($"{Comp}.pole2Hz", "Pole 2", "Hz", placement?.Pole2Hz ?? parts?.ToPlacement().Pole2Hz);
        R1 = new($"{Comp}.r1Ohm", "R1 (divider top)", "Ohm", parts?.R1Ohm ?? f.TopOhm, "Ω");
        C1 = new($"{Comp}.c1F", "C1", "F", ota?.C1F ?? parts?.C1F ?? 2.2e-9);
        R2 = new($"{Comp}.r2Ohm", "R2", "Ohm", ota?.R2Ohm ?? parts?.R2Ohm ?? 10e3, "Ω");
        C2 = new($"{Comp}.c2F", "C2", "F", ota?.C2F ?? parts?.C2F ?? 100e-12);
        R3 = new($"{Comp}.r3Ohm", "R3", "Ohm", parts?.R3Ohm ?? 1e3, "Ω");
        C3 = new($"{Comp}.c3F", "C3", "F", parts?.C3F ?? 1e-9);
        RBottom = new($"{Comp}.rBottomOhm", "R bottom", "Ohm", parts?.RBottomOhm ?? f.BottomOhm, "Ω");

        var a = design.Analysis;
        StartFrequency = new($"{Run}.startHz", "From", "Hz", a.StartHz);
        StopFrequency = new($"{Run}.stopHz", "To", "Hz", a.StopHz);
        Points = new($"{Run}.points", "Points", string.Empty, a.Points, "pts", wholeNumber: true);
        InputCorner = a.Input;
        LoadCorner = a.Load;
        ConductionModel = a.ConductionModel;
        LoadStep = new($"{Run}.loadStepA", "Load step", "A", a.LoadStepA);
        LoadStepSlew = new($"{Run}.loadStepSlewAPerS", "Load step slew", "A/s", a.LoadStepSlewAPerS);
        ReferenceStep = new($"{Run}.referenceStepV", "Reference step", "V", a.ReferenceStepV);
        StepDuration = new($"{Run}.stepDurationS", "Simulated time (empty: automatic)", "s", a.StepDurationS, optional: true);
        StepSamples = new($"{Run}.stepSamples", "Samples per step", string.Empty, a.StepSamples, "pts", wholeNumber: true);

        var k = design.Criteria;
        MinPhaseMargin = new($"{Crit}.minPhaseMarginDeg", "Phase margin, at least", "deg", k.MinPhaseMarginDeg, "°");
        MinGainMargin = new($"{Crit}.minGainMarginDb", "Gain margin, at least", "dB", k.MinGainMarginDb);
        MaxCrossoverFraction = new($"{Crit}.maxCrossoverFractionOfSwitching", "Crossover, at most", string.Empty, k.MaxCrossoverFractionOfSwitching, "× fsw");
        MinCrossover = new($"{Crit}.minCrossoverHz", "Crossover, at least (0: none)", "Hz", k.MinCrossoverHz);
        MaxOvershoot = new($"{Crit}.maxOvershootPct", "Reference-step overshoot, at most", "%", k.MaxOvershootPct, optional: true);
        MaxLoadStepDeviation = new($"{Crit}.maxLoadStepDeviationV", "Load-step deviation, at most", "V", k.MaxLoadStepDeviationV, optional: true);
        MinRippleFraction = new($"{Crit}.minRippleFraction", "Ripple current, at least", string.Empty, k.MinRippleFraction, "× Imax");
        MaxRippleFraction = new($"{Crit}.maxRippleFraction", "Ripple current, at most", string.Empty, k.MaxRippleFraction, "× Imax");

        // The synthesis section: the parts panel edits the series, R1 and the search; the rest travels unchanged.
        _synthesis = design.Synthesis;
        var sx = design.Synthesis ?? new SynthesisSettings();
        ResistorSeries = sx.ResistorSeries;
        CapacitorSeries = sx.CapacitorSeries;
        SearchNeighbours = sx.SearchNeighbours;
        PartsR1 = new($"{Parts}.r1Ohm", "R1 (empty: divider top)", "Ohm", sx.R1Ohm, "Ω", optional: true);
        Tolerances = new TolerancesForm(design.Tolerances, Capacitors);
    }

    /// <summary>The tolerances for the corners and Monte Carlo (the design file's "tolerances" section).</summary>
    public TolerancesForm Tolerances { get; }

    /// <summary>Short name of the design.</summary>
    public string Name { get; set; }

    /// <summary>What the rail is for.</summary>
    public string Description { get; set; }

    /// <summary>A custom plant loaded from a file (not editable here); null for a modelled power stage.</summary>
    public CustomPlant? CustomPlant { get; private set; }

    /// <summary>Input voltage, minimum.</summary>
    public FieldState InputMin { get; }

    /// <summary>Input voltage, nominal.</summary>
    public FieldState InputNominal { get; }

    /// <summary>Input voltage, maximum.</summary>
    public FieldState InputMax { get; }

    /// <summary>Output voltage.</summary>
    public FieldState OutputVoltage { get; }

    /// <summary>Lightest load.</summary>
    public FieldState LoadMin { get; }

    /// <summary>Full load.</summary>
    public FieldState LoadMax { get; }

    /// <summary>Switching frequency.</summary>
    public FieldState SwitchingFrequency { get; }

    /// <summary>Inductance.</summary>
    public FieldState Inductance { get; }

    /// <summary>Inductor DCR.</summary>
    public FieldState InductorDcr { get; }

    /// <summary>High-side switch on-resistance.</summary>
    public FieldState HighSideOn { get; }

    /// <summary>Synchronous or diode.</summary>
    public RectifierKind Rectifier { get; set; }

    /// <summary>Low-side MOSFET on-resistance or diode resistance.</summary>
    public FieldState RectifierOn { get; }

    /// <summary>Diode forward drop.</summary>
    public FieldState ForwardDrop { get; }

    /// <summary>Largest duty cycle.</summary>
    public FieldState MaxDutyCycle { get; }

    /// <summary>The output capacitor bank, one entry per branch.</summary>
    public List<CapacitorBranchForm> Capacitors { get; }

    /// <summary>Ramp follows the input voltage.</summary>
    public bool InputFeedforward { get; set; }

    /// <summary>Ramp amplitude Vm.</summary>
    public FieldState RampAmplitude { get; }

    /// <summary>Feedforward ramp per input volt.</summary>
    public FieldState FeedforwardRamp { get; }

    /// <summary>Voltage mode or peak current mode.</summary>
    public ControlScheme Scheme { get; set; }

    /// <summary>Peak current mode: current-sense gain Ri.</summary>
    public FieldState SenseGain { get; }

    /// <summary>Peak current mode: how the compensation ramp is entered.</summary>
    public CompensationRampKind RampKind { get; private set; }

    /// <summary>Peak current mode: the compensation ramp in the unit of <see cref="RampKind"/>.</summary>
    public FieldState RampValue { get; }

    /// <summary>Modulator delay.</summary>
    public FieldState ModulatorDelay { get; }

    /// <summary>Modulator delay as a fraction of the switching period (added to <see cref="ModulatorDelay"/>).</summary>
    public FieldState ModulatorDelayFraction { get; }

    /// <summary>Op-amp network: a real op-amp (finite gain and bandwidth) rather than an ideal one.</summary>
    public bool RealOpAmp { get; set; }

    /// <summary>Op-amp open-loop gain.</summary>
    public FieldState OpenLoopGain { get; }

    /// <summary>Op-amp gain-bandwidth product.</summary>
    public FieldState GainBandwidth { get; }

    /// <summary>Op-amp optional second pole.</summary>
    public FieldState SecondPole { get; }

    /// <summary>Transconductance amplifier gm.</summary>
    public FieldState Transconductance { get; }

    /// <summary>Transconductance amplifier output resistance.</summary>
    public FieldState OtaOutputResistance { get; }

    /// <summary>Which small-signal model the analysis uses.</summary>
    public ConductionModelChoice ConductionModel { get; set; }

    /// <summary>Divider top resistor.</summary>
    public FieldState DividerTop { get; }

    /// <summary>Divider bottom resistor.</summary>
    public FieldState DividerBottom { get; }

    /// <summary>Reference voltage.</summary>
    public FieldState Reference { get; }

    /// <summary>Placement or parts.</summary>
    public CompensatorMode Mode { get; set; }

    /// <summary>Type I, II or III.</summary>
    public CompensatorType CompensatorType { get; set; }

    /// <summary>What fixes the gain of a placement.</summary>
    public GainSettingKind GainKind { get; private set; }

    /// <summary>Value of the gain setting (Hz or dB by kind).</summary>
    public FieldState GainValue { get; }

    /// <summary>First zero.</summary>
    public FieldState Zero1 { get; }

    /// <summary>Second zero.</summary>
    public FieldState Zero2 { get; }

    /// <summary>First pole.</summary>
    public FieldState Pole1 { get; }

    /// <summary>Second pole.</summary>
    public FieldState Pole2 { get; }

    /// <summary>Op-amp network R1.</summary>
    public FieldState R1 { get; }

    /// <summary>Op-amp network C1.</summary>
    public FieldState C1 { get; }

    /// <summary>Op-amp network R2.</summary>
    public FieldState R2 { get; }

    /// <summary>Op-amp network C2.</summary>
    public FieldState C2 { get; }

    /// <summary>Op-amp network R3.</summary>
    public FieldState R3 { get; }

    /// <summary>Op-amp network C3.</summary>
    public FieldState C3 { get; }

    /// <summary>Op-amp network bottom resistor.</summary>
    public FieldState RBottom { get; }

    /// <summary>Lowest analysed frequency.</summary>
    public FieldState StartFrequency { get; }

    /// <summary>Highest analysed frequency.</summary>
    public FieldState StopFrequency { get; }

    /// <summary>Points of the plotted responses.</summary>
    public FieldState Points { get; }

    /// <summary>Input corner analysed.</summary>
    public InputCorner InputCorner { get; set; }

    /// <summary>Load corner analysed.</summary>
    public LoadCorner LoadCorner { get; set; }

    /// <summary>Load step size.</summary>
    public FieldState LoadStep { get; }

    /// <summary>Load step slew rate.</summary>
    public FieldState LoadStepSlew { get; }

    /// <summary>Reference step size.</summary>
    public FieldState ReferenceStep { get; }

    /// <summary>Simulated time; empty for automatic.</summary>
    public FieldState StepDuration { get; }

    /// <summary>Samples per step response.</summary>
    public FieldState StepSamples { get; }

    /// <summary>Criterion: phase margin.</summary>
    public FieldState MinPhaseMargin { get; }

    /// <summary>Criterion: gain margin.</summary>
    public FieldState MinGainMargin { get; }

    /// <summary>Criterion: crossover vs switching frequency.</summary>
    public FieldState MaxCrossoverFraction { get; }

    /// <summary>Criterion: lowest crossover.</summary>
    public FieldState MinCrossover { get; }

    /// <summary>Criterion: reference-step overshoot.</summary>
    public FieldState MaxOvershoot { get; }

    /// <summary>Criterion: load-step deviation.</summary>
    public FieldState MaxLoadStepDeviation { get; }

    /// <summary>Criterion: lowest ripple fraction.</summary>
    public FieldState MinRippleFraction { get; }

    /// <summary>Criterion: highest ripple fraction.</summary>
    public FieldState MaxRippleFraction { get; }

    /// <summary>Series the synthesised resistors snap to.</summary>
    public ESeries ResistorSeries { get; set; }

    /// <summary>Series the synthesised capacitors snap to.</summary>
    public ESeries CapacitorSeries { get; set; }

    /// <summary>Search the neighbouring preferred values when choosing parts.</summary>
    public bool SearchNeighbours { get; set; }

    /// <summary>R1 the parts are computed from; empty takes the divider's top resistor.</summary>
    public FieldState PartsR1 { get; }

    /// <summary>The compensator zeros and poles that the current type uses, in order z1, z2, p1, p2.</summary>
    public IEnumerable<FieldState> PlacementFrequencies => CompensatorType switch
    {
        CompensatorType.TypeI => [],
        CompensatorType.TypeII => [Zero1, Pole1],
        _ => [Zero1, Zero2, Pole1, Pole2],
    };

    /// <summary>Every field that takes part in the design as it is now set up.</summary>
    public IEnumerable<FieldState> ActiveFields
    {
        get
        {
            var list = new List<FieldState>();
            if (CustomPlant is null)
            {
                list.AddRange([InputMin, InputNominal, InputMax, OutputVoltage, LoadMin, LoadMax, SwitchingFrequency, Inductance, InductorDcr, HighSideOn, RectifierOn, MaxDutyCycle]);
                if (Rectifier == RectifierKind.Diode)
                {
                    list.Add(ForwardDrop);
                }

                list.AddRange(Capacitors.SelectMany(c => c.Fields));
                if (Scheme == ControlScheme.PeakCurrentMode)
                {
                    list.AddRange([SenseGain, RampValue]);
                }
                else
                {
                    list.Add(InputFeedforward ? FeedforwardRamp : RampAmplitude);
                }

                list.AddRange([ModulatorDelay, ModulatorDelayFraction, DividerTop, DividerBottom, Reference]);
            }

            if (Mode == CompensatorMode.Placement)
            {
                list.Add(GainValue);
                list.AddRange(PlacementFrequencies);
            }
            else if (Mode == CompensatorMode.Transconductance)
            {
                list.AddRange([Transconductance, OtaOutputResistance, C1]);
                if (CompensatorType != CompensatorType.TypeI)
                {
                    list.AddRange([R2, C2]);
                }
            }
            else
            {
                list.AddRange([R1, C1]);
                if (RealOpAmp)
                {
                    list.AddRange([OpenLoopGain, GainBandwidth, SecondPole]);
                }

                if (CompensatorType != CompensatorType.TypeI)
                {
                    list.AddRange([R2, C2]);
                }

                if (CompensatorType == CompensatorType.TypeIII)
                {
                    list.AddRange([R3, C3]);
                }
            }

            list.AddRange([StartFrequency, StopFrequency, Points, LoadStep, LoadStepSlew, ReferenceStep, StepDuration, StepSamples]);
            list.AddRange([MinPhaseMargin, MinGainMargin, MaxCrossoverFraction, MinCrossover, MaxOvershoot, MaxLoadStepDeviation, MinRippleFraction, MaxRippleFraction]);
            list.Add(PartsR1);
            list.AddRange(Tolerances.Fields);
            return list;
        }
    }

    /// <summary>Fields whose current text cannot be read.</summary>
    public IEnumerable<FieldState> UnreadableFields => ActiveFields.Where(f => !f.IsReadable);

    /// <summary>A form showing a design.</summary>
    public static DesignForm FromDesign(LoopDesign design) => new(design);

    /// <summary>The unit of the gain value for a gain kind.</summary>
    public static string GainUnit(GainSettingKind kind) => kind == GainSettingKind.MidbandGainDb ? "dB" : "Hz";

    /// <summary>The unit of the ramp value for a ramp kind (V/s, or a plain number for a multiple or mc).</summary>
    public static string RampUnit(CompensationRampKind kind) => kind == CompensationRampKind.VoltsPerSecond ? "V/s" : string.Empty;

    /// <summary>The unit shown beside the ramp value.</summary>
    public static string RampDisplayUnit(CompensationRampKind kind) => kind switch
    {
        CompensationRampKind.VoltsPerSecond => "V/s",
        CompensationRampKind.MultipleOfOffSlope => "× Sf",
        _ => "mc",
    };

    /// <summary>Changes how the compensation ramp is entered, starting from <paramref name="startValue"/> (in the new kind's unit).</summary>
    public void SetRampKind(CompensationRampKind kind, double? startValue)
    {
        RampKind = kind;
        RampValue.Retarget(RampUnit(kind), startValue, RampDisplayUnit(kind));
    }

    /// <summary>Changes what fixes the gain, starting from <paramref name="startValue"/> (Hz or dB) so that the loop stays where it was.</summary>
    public void SetGainKind(GainSettingKind kind, double? startValue)
    {
        GainKind = kind;
        GainValue.Retarget(GainUnit(kind), startValue);
    }

    /// <summary>Appends a capacitor branch like the last one (or a 10 uF ceramic when the bank is empty).</summary>
    public void AddCapacitor()
    {
        var like = Capacitors.Count > 0 ? Capacitors[^1].Build() : new CapacitorBranch("ceramic", 1, 10e-6, 0.005, 0.5e-9);
        if (!double.IsFinite(like.CapacitanceF) || !double.IsFinite(like.EsrOhm))
        {
            like = new CapacitorBranch("ceramic", 1, 10e-6, 0.005, 0.5e-9);
        }

        Capacitors.Add(new CapacitorBranchForm(Capacitors.Count, like with { Label = $"branch {Capacitors.Count + 1}" }));
    }

    /// <summary>Removes a capacitor branch and renumbers the rest.</summary>
    public void RemoveCapacitor(CapacitorBranchForm branch)
    {
        Capacitors.Remove(branch);
        for (int i = 0; i < Capacitors.Count; i++)
        {
            Capacitors[i].Reindex(i);
        }
    }

    /// <summary>Takes over a placement resolved by the core (parts to placement), gain as an integrator frequency.</summary>
    public void UsePlacement(CompensatorPlacement resolved)
    {
        Mode = CompensatorMode.Placement;
        CompensatorType = resolved.Type;
        SetGainKind(resolved.Gain.Kind, resolved.Gain.Value);
        Set(Zero1, resolved.Zero1Hz);
        Set(Zero2, resolved.Zero2Hz);
        Set(Pole1, resolved.Pole1Hz);
        Set(Pole2, resolved.Pole2Hz);

        static void Set(FieldState f, double? v)
        {
            if (v is double x)
            {
                f.SetValue(x);
            }
        }
    }

    /// <summary>The design from the last readable value of every field (the core validates it).</summary>
    public LoopDesign Build()
    {
        Plant plant = (Plant?)CustomPlant ?? new BuckPlant(
            new BuckPowerStage(
                new VoltageRange(V(InputMin), V(InputNominal), V(InputMax)),
                V(OutputVoltage),
                new CurrentRange(V(LoadMin), V(LoadMax)),
                V(SwitchingFrequency),
                new Inductor(V(Inductance), V(InductorDcr)),
                [.. Capacitors.Select(c => c.Build())],
                V(HighSideOn),
                new Rectifier(Rectifier, V(RectifierOn), Rectifier == RectifierKind.Diode ? V(ForwardDrop) : 0.0),
                V(MaxDutyCycle)),
            Scheme == ControlScheme.PeakCurrentMode
                ? new PeakCurrentModeControl(V(SenseGain), new CompensationRamp(RampKind, V(RampValue)), V(ModulatorDelay), V(ModulatorDelayFraction))
                : new VoltageModeControl(V(RampAmplitude), InputFeedforward, V(FeedforwardRamp), V(ModulatorDelay), V(ModulatorDelayFraction)),
            new FeedbackDivider(V(DividerTop), V(DividerBottom), V(Reference)));

        Compensator compensator = Mode == CompensatorMode.Transconductance
            ? new TransconductanceNetwork(
                CompensatorType,
                new Transconductance(V(Transconductance), V(OtaOutputResistance)),
                V(C1),
                CompensatorType == CompensatorType.TypeI ? 0.0 : V(R2),
                CompensatorType == CompensatorType.TypeI ? 0.0 : V(C2))
            : Mode == CompensatorMode.Placement
            ? new CompensatorPlacement(
                CompensatorType,
                new GainSetting(GainKind, V(GainValue)),
                CompensatorType == CompensatorType.TypeI ? null : Zero1.Value,
                CompensatorType == CompensatorType.TypeIII ? Zero2.Value : null,
                CompensatorType == CompensatorType.TypeI ? null : Pole1.Value,
                CompensatorType == CompensatorType.TypeIII ? Pole2.Value : null)
            : new OpAmpNetwork(
                CompensatorType,
                V(R1),
                V(C1),
                CompensatorType == CompensatorType.TypeI ? 0.0 : V(R2),
                CompensatorType == CompensatorType.TypeI ? 0.0 : V(C2),
                CompensatorType == CompensatorType.TypeIII ? V(R3) : 0.0,
                CompensatorType == CompensatorType.TypeIII ? V(C3) : 0.0,
                V(RBottom),
                RealOpAmp ? new OpAmp(V(OpenLoopGain), V(GainBandwidth), SecondPole.Value) : _idealAmplifier);

        var analysis = new AnalysisSettings(
            V(StartFrequency), V(StopFrequency), (int)V(Points), InputCorner, LoadCorner,
            V(LoadStep), V(LoadStepSlew), V(ReferenceStep), StepDuration.Value, (int)V(StepSamples), ConductionModel);
        var criteria = new DesignCriteria(
            V(MinPhaseMargin), V(MinGainMargin), V(MaxCrossoverFraction), V(MinCrossover),
            MaxOvershoot.Value, MaxLoadStepDeviation.Value, V(MinRippleFraction), V(MaxRippleFraction));
        return new LoopDesign(Name, Description, plant, compensator, analysis, criteria, BuildSynthesis(), Tolerances.Build());
    }

    /// <summary>The synthesis section; none when the design had none and the parts settings are still the defaults.</summary>
    private SynthesisSettings? BuildSynthesis()
    {
        var d = new SynthesisSettings();
        if (_synthesis is null && ResistorSeries == d.ResistorSeries && CapacitorSeries == d.CapacitorSeries && SearchNeighbours == d.SearchNeighbours && PartsR1.Value is null)
        {
            return null;
        }

        return (_synthesis ?? d) with { ResistorSeries = ResistorSeries, CapacitorSeries = CapacitorSeries, SearchNeighbours = SearchNeighbours, R1Ohm = PartsR1.Value };
    }

    private static double V(FieldState f) => f.Value ?? double.NaN;
}
