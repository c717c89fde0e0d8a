using System.Collections.Immutable;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;

namespace LoopShaper.Physics.Tests;

/// <summary>
/// Every rule of DesignValidator: the field path it reports, a message that names the allowed range, and an
/// analysis that never throws (shared/STYLE.md: bad input gives a clear message naming the field and the allowed
/// range, never an exception trace, never NaN). The ranges are the validator's own (our choice, no source).
/// </summary>
public class ValidationTests
{
    /// <summary>A numeric field: where it is, how to set it, its range and how the message prints the range ends.</summary>
    private sealed record NumericField(string Name, string Path, Func<LoopDesign> Base, Func<LoopDesign, double, LoopDesign> Set, double Min, double Max, bool MinExcluded, string MinText, string MaxText);

    private static readonly NumericField[] Fields =
    [
        Stage("inputVoltageV.min", (s, v) => s with { InputVoltage = s.InputVoltage with { MinV = v } }, 0, 2000, true, "0 V", "2.00 kV"),
        Stage("inputVoltageV.nominal", (s, v) => s with { InputVoltage = s.InputVoltage with { NominalV = v } }, 0, 2000, true, "0 V", "2.00 kV"),
        Stage("inputVoltageV.max", (s, v) => s with { InputVoltage = s.InputVoltage with { MaxV = v } }, 0, 2000, true, "0 V", "2.00 kV"),
        Stage("outputVoltageV", (s, v) => s with { OutputVoltageV = v }, 0, 1000, true, "0 V", "1.00 kV"),
        Stage("loadCurrentA.min", (s, v) => s with { LoadCurrent = s.LoadCurrent with { MinA = v } }, 0, 10000, false, "0 A", "10.0 kA"),
        Stage("loadCurrentA.max", (s, v) => s with { LoadCurrent = s.LoadCurrent with { MaxA = v } }, 0, 10000, true, "0 A", "10.0 kA"),
        Stage("switchingFrequencyHz", (s, v) => s with { SwitchingFrequencyHz = v }, 1e3, 100e6, false, "1.00 kHz", "100 MHz"),
        Stage("inductor.inductanceH", (s, v) => s with { Inductor = s.Inductor with { InductanceH = v } }, 1e-9, 1, false, "1.00 nH", "1.00 H"),
        Stage("inductor.dcrOhm", (s, v) => s with { Inductor = s.Inductor with { DcrOhm = v } }, 0, 100, false, "0 Ohm", "100 Ohm"),
        Capacitor(0, "capacitanceF", (b, v) => b with { CapacitanceF = v }, 1e-12, 10, "1.00 pF", "10.0 F"),
        Capacitor(1, "esrOhm", (b, v) => b with { EsrOhm = v }, 0, 100, "0 Ohm", "100 Ohm"),
        Capacitor(0, "eslH", (b, v) => b with { EslH = v }, 0, 1e-6, "0 H", "1.00 uH"),
        Stage("highSideOnResistanceOhm", (s, v) => s with { HighSideOnResistanceOhm = v }, 0, 100, false, "0 Ohm", "100 Ohm"),
        Stage("rectifier.onResistanceOhm", (s, v) => s with { Rectifier = s.Rectifier with { OnResistanceOhm = v } }, 0, 100, false, "0 Ohm", "100 Ohm"),
        Stage("rectifier.forwardDropV", (s, v) => s with { Rectifier = Rectifier.Diode(v, s.Rectifier.OnResistanceOhm) }, 0, 5, false, "0 V", "5.00 V"),
        Stage("maxDutyCycle", (s, v) => s with { MaxDutyCycle = v }, 0, 1, true, "above 0 ", "1.00"),
        new("plant.control.rampAmplitudeV", "plant.control.rampAmplitudeV", TestDesigns.Buck, (d, v) => d.WithControl(c => c with { RampAmplitudeV = v }), 1e-3, 100, false, "1.00 mV", "100 V"),
        new("plant.control.feedforwardRampPerVolt", "plant.control.feedforwardRampPerVolt", () => TestDesigns.Buck().WithControl(_ => new VoltageModeControl(0, true, 1.0 / 12)), (d, v) => d.WithControl(c => c with { FeedforwardRampPerVolt = v }), 1e-4, 10, false, "100 uV/V", "10.0 V/V"),
        new("plant.control.modulatorDelayS", "plant.control.modulatorDelayS", TestDesigns.Buck, (d, v) => d.WithControl(c => c with { ModulatorDelayS = v }), 0, 1e-3, false, "0 s", "1.00 ms"),
        new("plant.feedback.topOhm", "plant.feedback.topOhm", TestDesigns.Buck, (d, v) => d.WithFeedback(f => f with { TopOhm = v }), 1, 1e9, false, "1.00 Ohm", "1.00 GOhm"),
        new("plant.feedback.bottomOhm", "plant.feedback.bottomOhm", TestDesigns.Buck, (d, v) => d.WithFeedback(f => f with { BottomOhm = v }), 1, 1e9, false, "1.00 Ohm", "1.00 GOhm"),
        new("plant.feedback.referenceV", "plant.feedback.referenceV", TestDesigns.Buck, (d, v) => d.WithFeedback(f => f with { ReferenceV = v }), 0.01, 1000, false, "10.0 mV", "1.00 kV"),
        Network("r1Ohm", (n, v) => n with { R1Ohm = v }, 1, 1e9, "1.00 Ohm", "1.00 GOhm"),
        Network("c1F", (n, v) => n with { C1F = v }, 1e-15, 1, "1.00 fF", "1.00 F"),
        Network("r2Ohm", (n, v) => n with { R2Ohm = v }, 1, 1e9, "1.00 Ohm", "1.00 GOhm"),
        Network("c2F", (n, v) => n with { C2F = v }, 1e-15, 1, "1.00 fF", "1.00 F"),
        Network("r3Ohm", (n, v) => n with { R3Ohm = v }, 1, 1e9, "1.00 Ohm", "1.00 GOhm"),
        Network("c3F", (n, v) => n with { C3F = v }, 1e-15, 1, "1.00 fF", "1.00 F"),
        new("compensator.gain.value (Hz)", "compensator.gain.value", TestDesigns.CustomCoefficients, (d, v) => d.WithPlacement(p => p with { Gain = p.Gain with { Value = v } }), 1e-3, 1e9, false, "1.00 mHz", "1.00 GHz"),
        new("compensator.gain.value (dB)", "compensator.gain.value", TestDesigns.CustomFactors, (d, v) => d.WithPlacement(p => p with { Gain = p.Gain with { Value = v } }), -100, 100, false, "-100 dB", "100 dB"),
        Placement("zero1Hz", (p, v) => p with { Zero1Hz = v }),
        Placement("zero2Hz", (p, v) => p with { Zero2Hz = v }),
        Placement("pole1Hz", (p, v) => p with { Pole1Hz = v }),
        Placement("pole2Hz", (p, v) => p with { Pole2Hz = v }),
        Custom("numerator[0]", TestDesigns.CustomCoefficients, (c, v) => c with { NumeratorDescending = c.NumeratorDescending.SetItem(0, v) }, -1e300, 1e300, false, "-1E+300", "1E+300"),
        Custom("denominator[2]", TestDesigns.CustomCoefficients, (c, v) => c with { DenominatorDescending = c.DenominatorDescending.SetItem(2, v) }, -1e300, 1e300, false, "-1E+300", "1E+300"),
        Custom("delayS", TestDesigns.CustomCoefficients, (c, v) => c with { DelayS = v }, 0, 1, false, "0 s", "1.00 s"),
        Custom("dividerRatio", TestDesigns.CustomCoefficients, (c, v) => c with { DividerRatio = v }, 0, 1, true, "above 0 ", "1.00"),
        Custom("switchingFrequencyHz", TestDesigns.CustomCoefficients, (c, v) => c with { SwitchingFrequencyHz = v }, 1, 100e6, false, "1.00 Hz", "100 MHz"),
        Custom("zeros[0].frequencyHz", TestDesigns.CustomFactors, (c, v) => c with { Zeros = [Factor.Real(v)] }, 1e-6, 1e12, false, "1.00 uHz", "1.00 THz"),
        Custom("poles[0].frequencyHz", TestDesigns.CustomFactors, (c, v) => c with { Poles = [Factor.Pair(v, 2.0)] }, 1e-6, 1e12, false, "1.00 uHz", "1.00 THz"),
        Custom("poles[0].q", TestDesigns.CustomFactors, (c, v) => c with { Poles = [Factor.Pair(5e3, v)] }, 1e-3, 1e4, false, "1.00m", "10.0k"),
        Analysis("startHz", (a, v) => a with { StartHz = v }, 1e-3, 1e9, false, "1.00 mHz", "1.00 GHz"),
        Analysis("stopHz", (a, v) => a with { StopHz = v }, 1e-3, 1e10, false, "1.00 mHz", "10.0 GHz"),
        Analysis("loadStepA", (a, v) => a with { LoadStepA = v }, 0, 10000, false, "0 A", "10.0 kA"),
        Analysis("loadStepSlewAPerS", (a, v) => a with { LoadStepSlewAPerS = v }, 0, 1e12, false, "0 A/s", "1.00 TA/s"),
        Analysis("referenceStepV", (a, v) => a with { ReferenceStepV = v }, 0, 1000, false, "0 V", "1.00 kV"),
        Analysis("stepDurationS", (a, v) => a with { StepDurationS = v }, 0, 100, true, "0 s", "100 s"),
        Criteria("minPhaseMarginDeg", (k, v) => k with { MinPhaseMarginDeg = v }, 0, 180, false, "0 deg", "180 deg"),
        Criteria("minGainMarginDb", (k, v) => k with { MinGainMarginDb = v }, 0, 100, false, "0 dB", "100 dB"),
        Criteria("maxCrossoverFractionOfSwitching", (k, v) => k with { MaxCrossoverFractionOfSwitching = v }, 0, 1, true, "above 0 ", "1.00"),
        Criteria("minCrossoverHz", (k, v) => k with { MinCrossoverHz = v }, 0, 1e9, false, "0 Hz", "1.00 GHz"),
        Criteria("maxOvershootPct", (k, v) => k with { MaxOvershootPct = v }, 0, 1000, false, "0 %", "1.00 k%"),
        Criteria("maxLoadStepDeviationV", (k, v) => k with { MaxLoadStepDeviationV = v }, 0, 1000, true, "0 V", "1.00 kV"),
        Criteria("minRippleFraction", (k, v) => k with { MinRippleFraction = v }, 0, 10, false, "0 to ", "10.0"),
        Criteria("maxRippleFraction", (k, v) => k with { MaxRippleFraction = v }, 0, 10, false, "0 to ", "10.0"),
    ];

    public static TheoryData<string> FieldNames => [.. Fields.Select(f => f.Name)];

    public static TheoryData<string, string> NonFiniteCases
    {
        get
        {
            var data = new TheoryData<string, string>();
            foreach (var f in Fields)
            {
                data.Add(f.Name, "NaN");
                data.Add(f.Name, "+Infinity");
                data.Add(f.Name, "-Infinity");
            }

            return data;
        }
    }

    [Fact]
    public void Base_designs_are_valid_without_warnings()
    {
        foreach (var d in new[] { TestDesigns.Buck(), TestDesigns.CustomCoefficients(), TestDesigns.CustomFactors() })
        {
            var issues = DesignValidator.Validate(d);
            Assert.True(issues.Count == 0, $"{d.Name}: {string.Join("; ", issues)}");
        }
    }

    [Theory]
    [MemberData(nameof(FieldNames))]
    public void Value_below_the_range_is_an_error_naming_the_range(string name)
    {
        var f = Field(name);
        double below = f.Min > 0 ? f.Min / 2 : f.Min < 0 ? 2 * f.Min : -f.Max / 1000;
        AssertRejected(f.Set(f.Base(), below), f.Path, "out of range", f.MinText, f.MaxText);
        if (f.MinExcluded)
        {
            AssertRejected(f.Set(f.Base(), f.Min), f.Path, "out of range", f.MinText, f.MaxText);
        }
    }

    [Theory]
    [MemberData(nameof(FieldNames))]
    public void Value_above_the_range_is_an_error_naming_the_range(string name)
    {
        var f = Field(name);
        AssertRejected(f.Set(f.Base(), 2 * f.Max), f.Path, "out of range", f.MinText, f.MaxText);
    }

    [Theory]
    [MemberData(nameof(NonFiniteCases))]
    public void Non_finite_value_is_an_error_naming_the_range(string name, string value)
    {
        var f = Field(name);
        double v = value switch { "NaN" => double.NaN, "+Infinity" => double.PositiveInfinity, _ => double.NegativeInfinity };
        AssertRejected(f.Set(f.Base(), v), f.Path, "must be a finite number", f.MinText, f.MaxText);
    }

    [Theory]
    [MemberData(nameof(FieldNames))]
    public void Values_at_the_ends_of_the_range_are_not_out_of_range(string name)
    {
        var f = Field(name);
        var ends = f.MinExcluded ? new[] { f.Max } : [f.Min, f.Max];
        foreach (double v in ends)
        {
            var design = f.Set(f.Base(), v);
            var issues = AssertNoThrow(design).Issues;
            Assert.DoesNotContain(issues, i => i.Field == f.Path && (i.Message.Contains("out of range", StringComparison.Ordinal) || i.Message.Contains("finite number", StringComparison.Ordinal)));
        }
    }

    [Theory]
    [InlineData(0, "plant.powerStage.outputCapacitors[0].count")]
    [InlineData(10001, "plant.powerStage.outputCapacitors[0].count")]
    public void Capacitor_count_out_of_range(int count, string path)
        => AssertRejected(TestDesigns.Buck().WithCapacitor(0, b => b with { Count = count }), path, "out of range", "1 to 10000");

    [Theory]
    [InlineData(9)]
    [InlineData(100001)]
    public void Analysis_points_out_of_range(int points)
        => AssertRejected(TestDesigns.Buck() with { Analysis = new AnalysisSettings(Points: points) }, "analysis.points", "out of range", "10 to 100000");

    [Theory]
    [InlineData(9)]
    [InlineData(1000001)]
    public void Step_samples_out_of_range(int samples)
        => AssertRejected(TestDesigns.Buck() with { Analysis = new AnalysisSettings(StepSamples: samples) }, "analysis.stepSamples", "out of range", "10 to 1000000");

    [Theory]
    [InlineData(-4)]
    [InlineData(4)]
    public void Custom_plant_origin_order_out_of_range(int order)
        => AssertRejected(TestDesigns.CustomFactors().WithCustom(c => c with { OriginOrder = order, Poles = [Factor.Pair(5e3, 2), Factor.Pair(50e3, 1), Factor.Real(1e6), Factor.Real(2e6)] }), "plant.originOrder", "out of range", "-3 to 3");

    [Fact]
    public void Input_voltages_out_of_order()
        => AssertRejected(TestDesigns.Buck().WithStage(s => s with { InputVoltage = new VoltageRange(12, 10.8, 13.2) }), "plant.powerStage.inputVoltageV", "min <= nominal <= max");

    [Fact]
    public void Load_current_min_above_max()
        => AssertRejected(TestDesigns.Buck().WithStage(s => s with { LoadCurrent = new CurrentRange(12, 10) }), "plant.powerStage.loadCurrentA", "min <= max");

    [Fact]
    public void Audible_switching_frequency_is_a_warning()
        => AssertWarned(TestDesigns.Buck().WithStage(s => s with { SwitchingFrequencyHz = 15e3, Inductor = s.Inductor with { InductanceH = 47e-6 } }), "plant.powerStage.switchingFrequencyHz", "audible", "20 kHz");

    [Fact]
    public void No_output_capacitor()
        => AssertRejected(TestDesigns.Buck().WithStage(s => s with { OutputCapacitors = [] }), "plant.powerStage.outputCapacitors", "at least one");

    [Fact]
    public void Output_capacitors_left_unset()
        => AssertRejected(TestDesigns.Buck().WithStage(s => s with { OutputCapacitors = default }), "plant.powerStage.outputCapacitors", "at least one");

    [Fact]
    public void Forward_drop_on_a_synchronous_rectifier_is_a_warning()
        => AssertWarned(TestDesigns.Buck().WithStage(s => s with { Rectifier = s.Rectifier with { ForwardDropV = 0.3 } }), "plant.powerStage.rectifier.forwardDropV", "synchronous");

    [Fact]
    public void Output_voltage_not_below_the_minimum_input()
        => AssertRejected(TestDesigns.Buck().WithStage(s => s with { OutputVoltageV = 10.8 }), "plant.powerStage.outputVoltageV", "below the minimum input", "10.8 V");

    [Fact]
    public void Output_voltage_unreachable_at_the_maximum_duty_cycle()
    {
        // 10 V from 10.8 V needs D = 0.93 with the losses at full load, above the stage's maximum of 0.90.
        var d = TestDesigns.Buck().WithStage(s => s with { OutputVoltageV = 10.0 }).WithFeedback(f => f with { BottomOhm = 10e3 * 0.6 / 9.4 });
        AssertRejected(d, "plant.powerStage.outputVoltageV", "not reachable", "0.900", "plant.powerStage.maxDutyCycle");
    }

    [Fact]
    public void Divider_that_sets_another_output_voltage_is_a_warning()
        => AssertWarned(TestDesigns.Buck().WithFeedback(f => f with { BottomOhm = 2.0e3 }), "plant.feedback", "1 %", "3.60 V", "3.30 V");

    [Fact]
    public void R1_other_than_the_divider_top_resistor_is_a_warning()
        => AssertWarned(TestDesigns.Buck().WithNetwork(n => n with { R1Ohm = 12e3 }), "compensator.r1Ohm", "plant.feedback.topOhm", "12.0 kOhm", "10.0 kOhm");

    [Fact]
    public void Custom_plant_without_numerator()
        => AssertRejected(TestDesigns.CustomCoefficients().WithCustom(c => c with { NumeratorDescending = [] }), "plant.numerator", "at least one coefficient");

    [Fact]
    public void Custom_plant_without_denominator()
        => AssertRejected(TestDesigns.CustomCoefficients().WithCustom(c => c with { DenominatorDescending = [] }), "plant.denominator", "at least one coefficient");

    [Fact]
    public void Custom_plant_with_a_zero_denominator()
        => AssertRejected(TestDesigns.CustomCoefficients().WithCustom(c => c with { DenominatorDescending = [0.0, 0.0] }), "plant.denominator", "all zeros");

    [Fact]
    public void Custom_plant_with_a_zero_numerator()
        => AssertRejected(TestDesigns.CustomCoefficients().WithCustom(c => c with { NumeratorDescending = [0.0] }), "plant.numerator", "all zeros");

    [Fact]
    public void Custom_plant_improper_in_coefficient_form()
        => AssertRejected(TestDesigns.CustomCoefficients().WithCustom(c => c with { NumeratorDescending = [1.0, 0.0, 0.0, 1.0] }), "plant.numerator", "proper");

    [Fact]
    public void Custom_plant_improper_in_factor_form()
        => AssertRejected(TestDesigns.CustomFactors().WithCustom(c => c with { OriginOrder = 1, Zeros = [Factor.Real(100e3), Factor.Real(200e3)] }), "plant.zeros", "3 zeros against 2 poles", "proper");

    [Theory]
    [InlineData(0.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Custom_plant_gain_zero_or_not_finite(double gain)
        => AssertRejected(TestDesigns.CustomFactors().WithCustom(c => c with { Gain = gain }), "plant.gain", "finite, non-zero");

    [Fact]
    public void Custom_plant_in_factor_form_with_its_lists_left_unset()
    {
        // A factor-form plant whose zero and pole lists were never filled (default arrays, as a loader may leave them):
        // the validator must report it, not throw.
        var d = TestDesigns.CustomFactors().WithCustom(c => c with { Zeros = default, Poles = default });
        AssertNoThrow(d);
    }

    [Theory]
    [InlineData(1e300)]
    [InlineData(-1e300)]
    [InlineData(1e200)]
    public void Custom_plant_with_an_extreme_allowed_coefficient_does_not_throw(double constant)
    {
        // The coefficients are inside the allowed +-1e300, so the validator accepts them; finding the roots of
        // 1e-9 s^2 + 1.6e-5 s + 1e300 must give a message or a result, not an exception.
        AssertNoThrow(TestDesigns.CustomCoefficients().WithCustom(c => c with { DenominatorDescending = c.DenominatorDescending.SetItem(2, constant) }));
    }

    [Fact]
    public void Mid_band_gain_on_a_Type_I_placement()
        => AssertRejected(TestDesigns.CustomFactors().WithPlacement(p => new CompensatorPlacement(CompensatorType.TypeI, p.Gain)), "compensator.gain.kind", "Type I", "integratorHz or crossoverHz");

    [Theory]
    [InlineData(CompensatorType.TypeII, "compensator.zero1Hz")]
    [InlineData(CompensatorType.TypeII, "compensator.pole1Hz")]
    [InlineData(CompensatorType.TypeIII, "compensator.zero1Hz")]
    [InlineData(CompensatorType.TypeIII, "compensator.pole1Hz")]
    [InlineData(CompensatorType.TypeIII, "compensator.zero2Hz")]
    [InlineData(CompensatorType.TypeIII, "compensator.pole2Hz")]
    public void Missing_placement_frequency(CompensatorType type, string path)
    {
        var full = new CompensatorPlacement(type, new GainSetting(GainSettingKind.CrossoverHz, 30e3), 4e3, 4e3, 100e3, 250e3);
        var missing = path switch
        {
            "compensator.zero1Hz" => full with { Zero1Hz = null },
            "compensator.pole1Hz" => full with { Pole1Hz = null },
            "compensator.zero2Hz" => full with { Zero2Hz = null },
            _ => full with { Pole2Hz = null },
        };
        AssertRejected(TestDesigns.CustomCoefficients() with { Compensator = missing }, path, "required", "1 mHz to 1 GHz");
    }

    [Fact]
    public void Stop_frequency_not_above_start()
        => AssertRejected(TestDesigns.Buck() with { Analysis = new AnalysisSettings(StartHz: 1e3, StopHz: 1e3) }, "analysis.stopHz", "must be above analysis.startHz", "1.00 kHz");

    [Fact]
    public void Ripple_fraction_limits_out_of_order()
        => AssertRejected(TestDesigns.Buck() with { Criteria = new DesignCriteria(MinRippleFraction: 0.5, MaxRippleFraction: 0.3) }, "criteria.minRippleFraction", "criteria.maxRippleFraction");

    public static TheoryData<string> ValidDesignNames => ["buck", "buck light load at max input", "buck diode at light load", "buck feedforward with delay", "custom coefficients", "custom factors", "custom integrator, Type I"];

    [Theory]
    [MemberData(nameof(ValidDesignNames))]
    public void Valid_designs_give_no_NaN_anywhere(string name)
    {
        var design = ValidDesign(name);
        Assert.DoesNotContain(DesignValidator.Validate(design), i => i.Severity == Severity.Error);
        var a = DesignAnalyzer.Analyze(design);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));

        foreach (var (label, r) in new[] { ("plant", a.PlantResponse!), ("compensator", a.CompensatorResponse!), ("loop", a.LoopResponse!) })
        {
            Assert.True(r.Count >= 10, label);
            AssertFinite($"{label} frequency", r.FrequencyHz);
            AssertFinite($"{label} magnitude", r.MagnitudeDb);
            AssertFinite($"{label} phase", r.PhaseDeg);
        }

        var steps = new List<(string, StepResponse)> { ("reference step", a.ReferenceStep!) };
        if (design.Plant is BuckPlant)
        {
            Assert.NotNull(a.LoadStep);
            steps.Add(("load step", a.LoadStep));
        }

        foreach (var (label, s) in steps)
        {
            AssertFinite($"{label} time", s.TimeS);
            AssertFinite($"{label} value", s.Value);
            var m = s.Metrics;
            AssertFinite($"{label} metrics", [m.FinalValue ?? 0, m.PeakDeviation, m.PeakTimeS, m.OvershootPct ?? 0, m.UndershootPct ?? 0, m.RiseTimeS ?? 0, m.SettlingTimeS ?? 0, m.SettlingBand]);
        }

        var g = a.Margins!;
        Assert.NotEmpty(g.GainCrossovers);
        AssertFinite("gain crossovers", [.. g.GainCrossovers.SelectMany(c => new[] { c.FrequencyHz, c.PhaseDeg, c.PhaseMarginDeg })]);
        AssertFinite("phase crossovers", [.. g.PhaseCrossovers.SelectMany(c => new[] { c.FrequencyHz, c.CriticalPhaseDeg, c.MagnitudeDb, c.GainMarginDb })]);
        AssertFinite("touches", [.. g.Touches.SelectMany(c => new[] { c.FrequencyHz, c.PhaseMarginDeg })]);
        AssertFinite("margins", [g.CrossoverHz ?? 0, g.PhaseMarginDeg ?? 0, g.UpperGainMarginDb ?? 0, g.LowerGainMarginDb ?? 0, g.DelayMarginS ?? 0]);
        AssertFinite("closed-loop poles", [.. g.ClosedLoopPoles.SelectMany(p => new[] { p.Real, p.Imaginary })]);

        if (a.OperatingPoint is OperatingPoint op)
        {
            AssertFinite("operating point", [op.DutyCycle, op.RippleCurrentApp, op.OutputRippleVpp, op.BoundaryLoadCurrentA, op.EffectiveInputVoltageV, op.SeriesResistanceOhm]);
        }

        foreach (var c in a.Criteria)
        {
            Assert.DoesNotContain("NaN", c.Actual, StringComparison.Ordinal);
            Assert.DoesNotContain("inf", c.Actual, StringComparison.Ordinal);
        }

        foreach (var d in a.Derivations)
        {
            string text = d.Substituted + " " + d.Result;
            Assert.False(text.Contains("NaN", StringComparison.Ordinal) || text.Contains("n/a", StringComparison.Ordinal) || text.Contains("inf ", StringComparison.Ordinal), $"derivation '{d.Quantity}': {text}");
        }
    }

    private static LoopDesign ValidDesign(string name) => name switch
    {
        "buck" => TestDesigns.Buck() with { Criteria = new DesignCriteria(MaxOvershootPct: 20, MaxLoadStepDeviationV: 0.1, MinCrossoverHz: 10e3) },
        "buck light load at max input" => TestDesigns.Buck() with { Analysis = new AnalysisSettings(Input: InputCorner.Max, Load: LoadCorner.Min) },
        // At no load a diode rectifier skips pulses and no averaged model holds (analysis.load is rejected then);
        // 50 mA keeps the converter in DCM.
        "buck diode at light load" => TestDesigns.Buck().WithStage(s => s with { Rectifier = Rectifier.Diode(0.4, 0.01), LoadCurrent = new CurrentRange(0.05, 10) }) with
        {
            Compensator = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.CrossoverHz, 40e3), Zero1Hz: 4e3, Pole1Hz: 200e3),
            Analysis = new AnalysisSettings(Load: LoadCorner.Min),
        },
        "buck feedforward with delay" => TestDesigns.Buck().WithControl(_ => new VoltageModeControl(0, true, 1.0 / 12, 100e-9)),
        "custom coefficients" => TestDesigns.CustomCoefficients() with { Criteria = new DesignCriteria(MaxOvershootPct: 30) },
        "custom factors" => TestDesigns.CustomFactors(),
        "custom integrator, Type I" => TestDesigns.CustomFactors().WithCustom(c => c with { Gain = 2 * Math.PI * 1e3, OriginOrder = -1, Zeros = [], Poles = [Factor.Real(50e3)] }) with
        {
            Compensator = new CompensatorPlacement(CompensatorType.TypeI, new GainSetting(GainSettingKind.IntegratorHz, 2.0)),
        },
        _ => throw new ArgumentException("unknown design " + name, nameof(name)),
    };

    private static NumericField Field(string name) => Fields.Single(f => f.Name == name);

    private static NumericField Stage(string field, Func<BuckPowerStage, double, BuckPowerStage> set, double min, double max, bool minExcluded, string minText, string maxText)
        => new("plant.powerStage." + field, "plant.powerStage." + field, TestDesigns.Buck, (d, v) => d.WithStage(s => set(s, v)), min, max, minExcluded, minText, maxText);

    private static NumericField Capacitor(int index, string field, Func<CapacitorBranch, double, CapacitorBranch> set, double min, double max, string minText, string maxText)
    {
        string path = $"plant.powerStage.outputCapacitors[{index}].{field}";
        return new(path, path, TestDesigns.Buck, (d, v) => d.WithCapacitor(index, b => set(b, v)), min, max, false, minText, maxText);
    }

    private static NumericField Network(string field, Func<OpAmpNetwork, double, OpAmpNetwork> set, double min, double max, string minText, string maxText)
        => new("compensator." + field, "compensator." + field, TestDesigns.Buck, (d, v) => d.WithNetwork(n => set(n, v)), min, max, false, minText, maxText);

    private static NumericField Placement(string field, Func<CompensatorPlacement, double, CompensatorPlacement> set)
        => new("compensator." + field, "compensator." + field, TestDesigns.CustomCoefficients, (d, v) => d.WithPlacement(p => set(p, v)), 1e-3, 1e9, false, "1.00 mHz", "1.00 GHz");

    private static NumericField Custom(string field, Func<LoopDesign> baseDesign, Func<CustomPlant, double, CustomPlant> set, double min, double max, bool minExcluded, string minText, string maxText)
        => new("plant." + field, "plant." + field, baseDesign, (d, v) => d.WithCustom(c => set(c, v)), min, max, minExcluded, minText, maxText);

    private static NumericField Analysis(string field, Func<AnalysisSettings, double, AnalysisSettings> set, double min, double max, bool minExcluded, string minText, string maxText)
        => new("analysis." + field, "analysis." + field, TestDesigns.Buck, (d, v) => d with { Analysis = set(d.Analysis, v) }, min, max, minExcluded, minText, maxText);

    private static NumericField Criteria(string field, Func<DesignCriteria, double, DesignCriteria> set, double min, double max, bool minExcluded, string minText, string maxText)
        => new("criteria." + field, "criteria." + field, TestDesigns.Buck, (d, v) => d with { Criteria = set(d.Criteria, v) }, min, max, minExcluded, minText, maxText);

    /// <summary>The validator reports an error at the path whose message has every fragment; the analysis does not throw and is not valid.</summary>
    private static void AssertRejected(LoopDesign design, string path, params string[] fragments)
    {
        var issues = DesignValidator.Validate(design);
        string all = string.Join("\n", issues);
        var hit = issues.FirstOrDefault(i => i.Field == path && i.Severity == Severity.Error && fragments.All(f => i.Message.Contains(f, StringComparison.Ordinal)));
        Assert.True(hit is not null, $"expected an error at '{path}' mentioning [{string.Join(", ", fragments)}]; got:\n{all}");

        // A message a user reads: a sentence, not hundreds of digits.
        Assert.True(hit.Message.Length <= 250, $"message of {hit.Message.Length} characters: {hit.Message}");
        var a = AssertNoThrow(design);
        Assert.False(a.IsValid);
        Assert.Null(a.LoopResponse);
        Assert.Contains(a.Issues, i => i.Field == path && i.Severity == Severity.Error);
    }

    /// <summary>The validator reports a warning at the path with every fragment and no error; the analysis runs.</summary>
    private static void AssertWarned(LoopDesign design, string path, params string[] fragments)
    {
        var issues = DesignValidator.Validate(design);
        string all = string.Join("\n", issues);
        Assert.True(
            issues.Any(i => i.Field == path && i.Severity == Severity.Warning && fragments.All(f => i.Message.Contains(f, StringComparison.Ordinal))),
            $"expected a warning at '{path}' mentioning [{string.Join(", ", fragments)}]; got:\n{all}");
        Assert.DoesNotContain(issues, i => i.Severity == Severity.Error);
        var a = AssertNoThrow(design);
        Assert.True(a.IsValid, string.Join("; ", a.Issues));
        Assert.Contains(a.Issues, i => i.Field == path && i.Severity == Severity.Warning);
    }

    private static DesignAnalysis AssertNoThrow(LoopDesign design)
    {
        try
        {
            var a = DesignAnalyzer.Analyze(design);
            Assert.False(a.IsValid && a.Issues.Any(i => i.Severity == Severity.Error), "an analysis with errors claims to be valid");
            if (!a.IsValid)
            {
                Assert.Contains(a.Issues, i => i.Severity == Severity.Error);
            }

            return a;
        }
        catch (Exception ex) when (ex is not Xunit.Sdk.XunitException)
        {
            Assert.Fail($"DesignAnalyzer.Analyze threw {ex.GetType().Name}: {ex.Message}");
            throw;
        }
    }

    private static void AssertFinite(string label, IEnumerable<double> values)
    {
        int i = 0;
        foreach (double v in values)
        {
            Assert.True(double.IsFinite(v), $"{label}[{i}] = {v}");
            i++;
        }
    }

    private static void AssertFinite(string label, ImmutableArray<double> values) => AssertFinite(label, (IEnumerable<double>)values);
}
