using System.Text.Json.Nodes;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli.Tests;

public class DesignFileErrorTests
{
    /// <summary>A small valid buck design; each test breaks one thing.</summary>
    private const string Valid = """
        {
          "format": "loopshaper-design",
          "version": 1,
          "name": "test rail",
          "plant": {
            "model": "buck",
            "powerStage": {
              "inputVoltageV": { "min": 10, "nominal": 12, "max": 14 },
              "outputVoltageV": 3.3,
              "loadCurrentA": { "min": 0.2, "max": 3 },
              "switchingFrequencyHz": "500kHz",
              "inductor": { "inductanceH": "4.7 uH", "dcrOhm": "20 mOhm" },
              "outputCapacitors": [
                { "label": "ceramic", "count": 2, "capacitanceF": "22µF", "esrOhm": 0.003 }
              ],
              "highSideOnResistanceOhm": "50m",
              "rectifier": { "kind": "synchronous", "onResistanceOhm": "20 mΩ" }
            },
            "control": { "scheme": "voltageMode", "rampAmplitudeV": 1 },
            "feedback": { "topOhm": "31.6k", "bottomOhm": "10k", "referenceV": 0.8 }
          },
          "compensator": {
            "form": "placement",
            "type": "typeIII",
            "gain": { "kind": "crossoverHz", "value": "40 kHz" },
            "zero1Hz": "3k", "zero2Hz": "5 kHz", "pole1Hz": "150 kHz", "pole2Hz": "250 kHz"
          }
        }
        """;

    [Fact]
    public void The_valid_base_reads_with_si_prefixed_texts_and_defaults()
    {
        var read = DesignFile.Read(Valid);
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
        var buck = Assert.IsType<BuckPlant>(read.Design!.Plant);
        // SI prefixes as in shared/CONVENTIONS.md: u and µ micro, m milli, k kilo; tolerances cover the decimal product.
        Assert.Equal(4.7e-6, buck.PowerStage.Inductor.InductanceH, 1e-20);
        Assert.Equal(0.020, buck.PowerStage.Inductor.DcrOhm, 1e-16);
        Assert.Equal(500e3, buck.PowerStage.SwitchingFrequencyHz, 1e-9);
        Assert.Equal(22e-6, buck.PowerStage.OutputCapacitors[0].CapacitanceF, 1e-20);
        Assert.Equal(0.050, buck.PowerStage.HighSideOnResistanceOhm, 1e-16);
        Assert.Equal(0.020, buck.PowerStage.Rectifier.OnResistanceOhm, 1e-16);
        Assert.Equal(31.6e3, buck.Feedback.TopOhm, 1e-9);
        Assert.Equal(3e3, ((CompensatorPlacement)read.Design.Compensator).Zero1Hz!.Value, 1e-9);
        // Left out: the record defaults.
        Assert.Equal(0.0, buck.PowerStage.OutputCapacitors[0].EslH);
        Assert.Equal(0.0, buck.PowerStage.Rectifier.ForwardDropV);
        Assert.Equal(0.95, buck.PowerStage.MaxDutyCycle);
        Assert.False(((VoltageModeControl)buck.Control).InputFeedforward);
        Assert.Equal(string.Empty, read.Design.Description);
        Assert.Equal(new AnalysisSettings(), read.Design.Analysis);
        Assert.Equal(new DesignCriteria(), read.Design.Criteria);
        Assert.True(DesignAnalyzer.Analyze(read.Design).IsValid);
    }

    [Fact]
    public void Unknown_fields_are_errors_with_their_path_and_the_allowed_names()
    {
        var e = Errors(j =>
        {
            j["plant"]!["powerStage"]!["inductor"]!["colour"] = "red";
            j["comment"] = "not a field";
        });
        Assert.Equal(2, e.Count);
        var inductor = Single(e, "$.plant.powerStage.inductor.colour");
        Assert.Contains("is not a field of the inductor; allowed fields: dcrOhm, inductanceH.", inductor.Message, StringComparison.Ordinal);
        Assert.Contains("is not a field of a design file", Single(e, "$.comment").Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_field_of_the_other_compensator_form_is_unknown_here()
    {
        var e = Errors(j => j["compensator"]!["r1Ohm"] = "10k");
        Assert.Contains("is not a field of a placement compensator", Single(e, "$.compensator.r1Ohm").Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("2.2 uF", "henries (H)")]
    [InlineData("2.2 uHz", "henries (H)")]
    [InlineData("2.2 xH", "henries (H)")]
    public void A_text_with_the_wrong_unit_names_the_path_and_the_expected_unit(string text, string expected)
    {
        var e = Errors(j => j["plant"]!["powerStage"]!["inductor"]!["inductanceH"] = text);
        var issue = Single(e, "$.plant.powerStage.inductor.inductanceH");
        Assert.StartsWith($"expects a number in {expected}", issue.Message, StringComparison.Ordinal);
        Assert.Contains($"'{text}'", issue.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_frequency_in_volts_is_rejected()
    {
        var e = Errors(j => j["plant"]!["powerStage"]!["switchingFrequencyHz"] = "500 kV");
        Assert.Contains("a unit other than Hz", Single(e, "$.plant.powerStage.switchingFrequencyHz").Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Wrong_types_say_what_was_expected_and_what_was_found()
    {
        var e = Errors(j =>
        {
            j["plant"]!["powerStage"]!["inductor"]!["dcrOhm"] = true;
            j["name"] = 5;
            j["plant"]!["powerStage"]!["outputCapacitors"] = new JsonObject();
            j["plant"]!["control"] = new JsonArray();
            j["plant"]!["feedback"]!["referenceV"] = null;
        });
        Assert.Equal("must be a number in ohms (Ohm), or text such as \"10 mOhm\" or \"4.7k\"; got true.", Single(e, "$.plant.powerStage.inductor.dcrOhm").Message);
        Assert.Equal("must be a text in quotes; got the number 5.", Single(e, "$.name").Message);
        Assert.Equal("must be an array [ ... ]; got an object.", Single(e, "$.plant.powerStage.outputCapacitors").Message);
        Assert.Equal("must be an object { ... }; got an array.", Single(e, "$.plant.control").Message);
        Assert.EndsWith("; got null.", Single(e, "$.plant.feedback.referenceV").Message, StringComparison.Ordinal);
        Assert.Equal(5, e.Count);
    }

    [Fact]
    public void Missing_required_fields_are_named()
    {
        var e = Errors(j =>
        {
            j["plant"]!["powerStage"]!.AsObject().Remove("outputVoltageV");
            j["compensator"]!.AsObject().Remove("zero2Hz");
            j["plant"]!["powerStage"]!["outputCapacitors"]![0]!.AsObject().Remove("count");
        });
        Assert.Equal("is required: a number in volts (V), or text such as \"3.3 V\".", Single(e, "$.plant.powerStage.outputVoltageV").Message);
        Assert.StartsWith("is required for a typeIII compensator", Single(e, "$.compensator.zero2Hz").Message, StringComparison.Ordinal);
        Assert.Equal("is required: a whole number.", Single(e, "$.plant.powerStage.outputCapacitors[0].count").Message);
        Assert.Equal(3, e.Count);
    }

    [Fact]
    public void A_missing_object_gives_one_message_not_one_per_field()
    {
        var e = Errors(j => j["plant"]!.AsObject().Remove("powerStage"));
        Assert.Equal("is required: an object { ... }.", Assert.Single(e).Message);
        Assert.Equal("$.plant.powerStage", e[0].Field);
    }

    [Fact]
    public void Unknown_words_list_the_allowed_ones()
    {
        var e = Errors(j =>
        {
            j["plant"]!["powerStage"]!["rectifier"]!["kind"] = "schottky";
            j["compensator"]!["type"] = "TypeIII";
            j["analysis"] = new JsonObject { ["input"] = "typical" };
        });
        Assert.Equal("\"schottky\" is not allowed here: use one of \"synchronous\", \"diode\".", Single(e, "$.plant.powerStage.rectifier.kind").Message);
        Assert.Equal("\"TypeIII\" is not allowed here: use one of \"typeI\", \"typeII\", \"typeIII\".", Single(e, "$.compensator.type").Message);
        Assert.Equal("\"typical\" is not allowed here: use one of \"min\", \"nominal\", \"max\".", Single(e, "$.analysis.input").Message);
        Assert.Equal(3, e.Count);
    }

    [Fact]
    public void The_gain_value_takes_the_unit_of_its_kind()
    {
        var e = Errors(j => j["compensator"]!["gain"] = new JsonObject { ["kind"] = "midbandGainDb", ["value"] = "40 kHz" });
        Assert.StartsWith("expects a number in decibels (dB)", Single(e, "$.compensator.gain.value").Message, StringComparison.Ordinal);

        // An unknown kind is one error; the value is not judged against a guessed unit.
        e = Errors(j => j["compensator"]!["gain"] = new JsonObject { ["kind"] = "crossover", ["value"] = "40 kHz" });
        Assert.Equal("$.compensator.gain.kind", Assert.Single(e).Field);
    }

    [Fact]
    public void An_unknown_plant_model_does_not_flood_the_report_with_unknown_fields()
    {
        var e = Errors(j => j["plant"]!["model"] = "boost");
        Assert.Equal("$.plant.model", Assert.Single(e).Field);
    }

    [Theory]
    [InlineData(3, "version 3 is newer than this program reads: it reads versions 1 to 2.")]
    [InlineData(0, "version 0 does not exist: the versions are 1 to 2.")]
    public void A_version_this_program_does_not_know_stops_reading(int version, string message)
    {
        var e = Errors(j =>
        {
            j["version"] = version;
            j["plant"]!["powerStage"]!["inductor"]!["colour"] = "red";
        });
        Assert.Equal(message, Single(e, "$.version").Message);
        Assert.Single(e);
    }

    [Fact]
    public void Another_format_stops_reading()
    {
        var e = Errors(j => j["format"] = "some-other-tool");
        Assert.Equal("\"some-other-tool\" is not a LoopShaper design file: expected \"loopshaper-design\".", Assert.Single(e).Message);
        Assert.Equal("$.format", e[0].Field);
    }

    [Fact]
    public void A_syntax_error_gives_its_line_and_column()
    {
        // Line 9 of the base ends `"outputVoltageV": 3.3,`: without the comma the next field starts on line 10.
        var lines = Valid.Split('\n');
        Assert.EndsWith("\"outputVoltageV\": 3.3,", lines[8], StringComparison.Ordinal);
        lines[8] = lines[8].TrimEnd(',');
        var read = DesignFile.Read(string.Join('\n', lines));
        Assert.Null(read.Design);
        var issue = Assert.Single(read.Errors);
        Assert.Equal("$", issue.Field);
        Assert.StartsWith("JSON syntax error at line 10, column 7:", issue.Message, StringComparison.Ordinal);
        Assert.DoesNotContain("LineNumber", issue.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Whole_numbers_reject_fractions_and_accept_prefixes()
    {
        var e = Errors(j => j["analysis"] = new JsonObject { ["points"] = 10.5 });
        Assert.Equal("must be a whole number; got 10.5.", Single(e, "$.analysis.points").Message);

        var read = Read(j => j["analysis"] = new JsonObject { ["stepSamples"] = "2k", ["points"] = 1e3 });
        Assert.Equal(2000, read.Design!.Analysis.StepSamples);
        Assert.Equal(1000, read.Design.Analysis.Points);
    }

    [Fact]
    public void A_field_given_twice_is_an_error()
    {
        string json = Valid.Replace("\"name\": \"test rail\",", "\"name\": \"a\", \"name\": \"b\",", StringComparison.Ordinal);
        var read = DesignFile.Read(json);
        Assert.Null(read.Design);
        Assert.Equal("appears more than once in the object.", Single([.. read.Errors], "$.name").Message);
    }

    [Fact]
    public void All_errors_are_collected_and_nothing_is_half_loaded()
    {
        var read = Read(j =>
        {
            j["plant"]!["powerStage"]!["inductor"]!["inductanceH"] = "2.2 uF";
            j["plant"]!["powerStage"]!["rectifier"]!["kind"] = "schottky";
            j["criteria"] = new JsonObject { ["minPhaseMarginDeg"] = "45 dB" };
        });
        Assert.Null(read.Design);
        Assert.False(read.Succeeded);
        Assert.Equal(["$.plant.powerStage.inductor.inductanceH", "$.plant.powerStage.rectifier.kind", "$.criteria.minPhaseMarginDeg"], read.Errors.Select(i => i.Field));
        Assert.All(read.Errors, i => Assert.Equal(Severity.Error, i.Severity));
    }

    [Fact]
    public void Ranges_are_left_to_the_validator_which_names_the_same_field()
    {
        var read = Read(j => j["plant"]!["powerStage"]!["inductor"]!["inductanceH"] = "330 H");
        Assert.True(read.Errors.IsEmpty);
        var issue = Assert.Single(DesignValidator.Validate(read.Design!), i => i.Severity == Severity.Error);
        Assert.Equal("plant.powerStage.inductor.inductanceH", issue.Field);
        Assert.Contains("out of range", issue.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Null_is_accepted_where_a_field_may_be_absent()
    {
        var read = Read(j =>
        {
            j["analysis"] = new JsonObject { ["stepDurationS"] = null };
            j["criteria"] = new JsonObject { ["maxOvershootPct"] = null, ["maxLoadStepDeviationV"] = "50 mV" };
        });
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
        Assert.Null(read.Design!.Analysis.StepDurationS);
        Assert.Null(read.Design.Criteria.MaxOvershootPct);
        Assert.Equal(0.05, read.Design.Criteria.MaxLoadStepDeviationV!.Value, 1e-15);
    }

    [Fact]
    public void Feedforward_makes_the_ramp_per_volt_required_and_the_ramp_optional()
    {
        var e = Errors(j => j["plant"]!["control"] = new JsonObject { ["scheme"] = "voltageMode", ["inputFeedforward"] = true });
        Assert.StartsWith("is required", Single(e, "$.plant.control.feedforwardRampPerVolt").Message, StringComparison.Ordinal);
        Assert.Single(e);
    }

    [Fact]
    public void An_op_amp_network_needs_the_parts_its_type_uses()
    {
        var e = Errors(j => j["compensator"] = new JsonObject { ["form"] = "opAmpNetwork", ["type"] = "typeII", ["r1Ohm"] = "31.6k", ["c1F"] = "4.7n" });
        Assert.StartsWith("is required for a typeII compensator: a number in ohms", Single(e, "$.compensator.r2Ohm").Message, StringComparison.Ordinal);
        Assert.StartsWith("is required for a typeII compensator: a number in farads", Single(e, "$.compensator.c2F").Message, StringComparison.Ordinal);
        Assert.Equal(2, e.Count);
    }

    [Fact]
    public void A_custom_plant_in_factor_form_reads_its_zeros_and_poles()
    {
        var read = Read(j => j["plant"] = JsonNode.Parse("""
            { "model": "custom", "form": "factors", "gain": 20, "originOrder": 0,
              "zeros": [ { "frequencyHz": "12 kHz", "rightHalfPlane": true } ],
              "poles": [ { "frequencyHz": "1 kHz", "q": 2 }, { "frequencyHz": 50000 } ],
              "delayS": "2 us", "dividerRatio": 0.1, "switchingFrequencyHz": "250 kHz" }
            """));
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
        var p = Assert.IsType<CustomPlant>(read.Design!.Plant);
        Assert.Equal(CustomPlantForm.Factors, p.Form);
        Assert.True(p.Zeros[0].RightHalfPlane);
        Assert.Equal(2.0, p.Poles[0].Q);
        Assert.Null(p.Poles[1].Q);
        Assert.Equal(2e-6, p.DelayS, 1e-21);
        Assert.Equal(250e3, p.SwitchingFrequencyHz!.Value, 1e-9);
    }

    [Fact]
    public void A_coefficient_array_item_of_the_wrong_type_is_named_by_index()
    {
        var e = Errors(j => j["plant"] = JsonNode.Parse("""{ "model": "custom", "form": "coefficients", "numerator": [1, "x"], "denominator": [1, 2, "3 Hz"] }"""));
        Assert.Contains("'x' is not a number", Single(e, "$.plant.numerator[1]").Message, StringComparison.Ordinal);
        Assert.Contains("unknown prefix", Single(e, "$.plant.denominator[2]").Message, StringComparison.Ordinal);
        Assert.Equal(2, e.Count);
    }

    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    [InlineData("null")]
    [InlineData("[]")]
    [InlineData("\"loopshaper-design\"")]
    [InlineData("{")]
    [InlineData("{\"format\": \"loopshaper-design\", \"version\": 1}")]
    [InlineData("{\"format\": \"loopshaper-design\", \"version\": 1e999}")]
    [InlineData("{\"format\": \"loopshaper-design\", \"version\": 1, \"name\": \"x\", \"plant\": 1, \"compensator\": {}}")]
    public void Read_never_throws_and_never_half_loads(string json)
    {
        var read = DesignFile.Read(json);
        Assert.Null(read.Design);
        Assert.NotEmpty(read.Errors);
        Assert.All(read.Errors, i => Assert.StartsWith("$", i.Field, StringComparison.Ordinal));
    }

    [Fact]
    public void Deep_nesting_is_a_syntax_error_not_a_crash()
    {
        var read = DesignFile.Read(new string('[', 10000) + new string(']', 10000));
        Assert.Null(read.Design);
        Assert.StartsWith("JSON syntax error", Assert.Single(read.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Comments_are_ignored()
    {
        var read = DesignFile.Read("// saved by hand\n" + Valid.Replace("\"version\": 1,", "\"version\": 1, /* first version */", StringComparison.Ordinal));
        Assert.True(read.Errors.IsEmpty, string.Join("\n", read.Errors));
    }

    private static DesignFileResult Read(Action<JsonNode> change) => DesignFileEdits.Read(Valid, change);

    private static List<ValidationIssue> Errors(Action<JsonNode> change) => DesignFileEdits.Errors(Valid, change);

    private static ValidationIssue Single(List<ValidationIssue> errors, string path) => DesignFileEdits.OnlyAt(errors, path);
}
