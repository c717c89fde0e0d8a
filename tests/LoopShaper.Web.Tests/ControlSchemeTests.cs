using System.Text.Json;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;

namespace LoopShaper.Web.Tests;

/// <summary>The control scheme and amplifier inputs: a peak current-mode design stays one, field by field.</summary>
public sealed class ControlSchemeTests : BunitContext
{
    public ControlSchemeTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
    }

    private static LoopDesign PcmExample => Example("pol-12v-to-3v3-peak-current-mode.json");

    [Fact]
    public void Saving_the_peak_current_mode_example_gives_back_the_loaded_design()
    {
        var design = PcmExample;
        Assert.IsType<PeakCurrentModeControl>(((BuckPlant)design.Plant).Control);
        Assert.IsType<TransconductanceNetwork>(design.Compensator);
        Assert.Equal(DesignFile.Write(design), DesignFile.Write(DesignForm.FromDesign(design).Build()));
    }

    [Theory]
    [InlineData("core-rail-12v-to-1v0.json")]
    [InlineData("sensor-24v-to-5v-light-load-dcm.json")]
    [InlineData("usb-5v-to-3v3-diode.json")]
    [InlineData("industrial-24v-to-5v.json")]
    public void Every_modelled_example_round_trips_through_the_form(string file)
    {
        var design = Example(file);
        Assert.Equal(DesignFile.Write(design), DesignFile.Write(DesignForm.FromDesign(design).Build()));
    }

    [Fact]
    public void Peak_current_mode_fields_show_the_example_values()
    {
        var form = DesignForm.FromDesign(PcmExample);
        var cut = Render<ControlSchemeEditor>(p => p.Add(c => c.Form, form));

        Assert.Equal(ControlScheme.PeakCurrentMode.ToString(), cut.Find("[data-control-scheme]").GetAttribute("value"));
        Assert.Equal(CompensationRampKind.MultipleOfOffSlope.ToString(), cut.Find("[data-ramp-kind]").GetAttribute("value"));
        // Values of docs/examples/pol-12v-to-3v3-peak-current-mode.json: Ri = 0.1 Ohm, ramp 0.5 × Sf, delay 60 ns.
        Assert.Equal("100 mOhm", cut.Find("#f-plant-control-senseGainOhm").GetAttribute("value"));
        Assert.Equal("0.5", cut.Find("#f-plant-control-ramp-value").GetAttribute("value"));
        Assert.Equal("60 ns", cut.Find("#f-plant-control-modulatorDelayS").GetAttribute("value"));
        Assert.Empty(cut.FindAll("#f-plant-control-rampAmplitudeV"));
    }

    [Fact]
    public void A_bad_sense_gain_and_a_negative_ramp_show_the_core_messages_beside_their_fields()
    {
        var form = DesignForm.FromDesign(PcmExample);
        form.SenseGain.SetText("0");
        form.RampValue.SetText("-1");
        var issues = new FieldIssues(DesignValidator.Validate(form.Build()));

        var cut = Render<ControlSchemeEditor>(p => p.Add(c => c.Form, form).Add(c => c.Issues, issues));

        // Messages from LoopShaper.Core.Validation.DesignValidator.
        Assert.Contains("out of range", cut.Find("[data-field-message='plant.control.senseGainOhm']").TextContent, StringComparison.Ordinal);
        Assert.Contains(cut.FindAll("[data-field-message='plant.control.ramp.value']"), m => m.TextContent.Contains("negative compensation slope", StringComparison.Ordinal));
    }

    [Fact]
    public void Switching_the_scheme_changes_the_design_the_form_builds()
    {
        var form = DesignForm.FromDesign(PcmExample);
        var cut = Render<ControlSchemeEditor>(p => p.Add(c => c.Form, form));

        cut.Find("[data-control-scheme]").Change(ControlScheme.VoltageMode.ToString());
        var vm = Assert.IsType<VoltageModeControl>(((BuckPlant)form.Build().Plant).Control);
        Assert.Equal(60e-9, vm.ModulatorDelayS, 12);
        Assert.NotEmpty(cut.FindAll("#f-plant-control-rampAmplitudeV"));

        cut.Find("[data-control-scheme]").Change(ControlScheme.PeakCurrentMode.ToString());
        cut.Find("[data-ramp-kind]").Change(CompensationRampKind.Mc.ToString());
        cut.Find("#f-plant-control-ramp-value").Input("1.8");
        var pcm = Assert.IsType<PeakCurrentModeControl>(((BuckPlant)form.Build().Plant).Control);
        Assert.Equal(new CompensationRamp(CompensationRampKind.Mc, 1.8), pcm.Ramp);
        Assert.Equal(0.1, pcm.SenseGainOhm, 12);
    }

    [Fact]
    public void The_op_amp_choice_builds_a_real_amplifier_with_its_fields()
    {
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        form.Mode = CompensatorMode.Parts;
        var cut = Render<CompensatorEditor>(p => p.Add(c => c.Form, form));

        cut.Find("[data-amplifier]").Change("True");
        cut.Find("#f-compensator-amplifier-gainBandwidthHz").Input("2 MHz");
        var network = Assert.IsType<OpAmpNetwork>(form.Build().Compensator);
        var amp = Assert.IsType<OpAmp>(network.Amplifier);
        Assert.Equal(2e6, amp.GainBandwidthHz, 6);
        Assert.Null(amp.SecondPoleHz);

        cut.Find("[data-amplifier]").Change("False");
        Assert.Null(((OpAmpNetwork)form.Build().Compensator).Amplifier);
    }

    [Fact]
    public void The_summary_shows_the_model_and_qp_as_the_core_computed_them()
    {
        var analysis = DesignAnalyzer.Analyze(PcmExample);
        var cm = analysis.CurrentMode!;
        var cut = Render<SummaryPanel>(p => p.Add(s => s.Analysis, analysis));

        Assert.Equal("CCM", cut.Find("[data-kpi-value='model']").TextContent);
        Assert.Equal(cm.Qp!.Value.ToString("F2", System.Globalization.CultureInfo.InvariantCulture), cut.Find("[data-kpi-value='qp']").TextContent);
        Assert.Contains("Qp = 1 needs mc", cut.Find("[data-kpi='qp']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void A_ramp_too_small_for_a_duty_cycle_above_half_shows_the_subharmonic_state()
    {
        // Ridley 1991: with no ramp (mc = 1) the current loop is unstable for D > 0.5; 12 V to 3.3 V raised to 9 V output.
        var form = DesignForm.FromDesign(PcmExample);
        form.OutputVoltage.SetText("9 V");
        form.SetRampKind(CompensationRampKind.Mc, 1.0);
        var analysis = DesignAnalyzer.Analyze(form.Build());
        Assert.True(analysis.CurrentMode!.IsSubharmonicallyUnstable);

        var cut = Render<SummaryPanel>(p => p.Add(s => s.Analysis, analysis));
        Assert.Equal("unstable", cut.Find("[data-kpi-value='qp']").TextContent);
    }

    [Fact]
    public void A_finite_gain_bandwidth_op_amp_adds_the_ideal_amplifier_traces_to_the_chart_and_they_toggle()
    {
        var module = PlotlyModule.Setup(this);
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        form.Mode = CompensatorMode.Parts;
        form.RealOpAmp = true;
        form.GainBandwidth.SetText("1 MHz");
        var analysis = DesignAnalyzer.Analyze(form.Build());
        Assert.NotNull(analysis.IdealAmplifierLoopResponse);

        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Form, form));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        var names = TraceNames(module.Invocations["newPlot"].Single().Arguments[1]);
        Assert.Contains(BodeFigure.IdealLoopName, names);
        Assert.Contains(BodeFigure.IdealCompensatorName, names);

        // The ideal loop sent is the core's ideal-amplifier loop, not the real one: its low-frequency gain is higher
        // (finite open-loop gain A0 = 1e5 caps the real integrator).
        using (var doc = JsonDocument.Parse(JsonSerializer.Serialize(module.Invocations["newPlot"].Single().Arguments[1])))
        {
            var ideal = doc.RootElement.EnumerateArray().First(t => t.GetProperty("name").GetString() == BodeFigure.IdealLoopName);
            Assert.Equal(analysis.IdealAmplifierLoopResponse!.MagnitudeDb[0], ideal.GetProperty("y")[0].GetDouble(), 1e-3);
            Assert.True(analysis.IdealAmplifierLoopResponse.MagnitudeDb[0] > analysis.LoopResponse!.MagnitudeDb[0]);
        }

        cut.Find("[data-trace-toggle='ideal-amplifier']").Change(false);
        Eventually.True(() => PlotlyModule.Calls(module).Count(i => i.Identifier == "react") == 1, "the redraw with Plotly.react");
        using var after = JsonDocument.Parse(JsonSerializer.Serialize(module.Invocations["react"].Single().Arguments[1]));
        var traces = after.RootElement.EnumerateArray().ToList();
        var sent = traces.Select(t => t.GetProperty("name").GetString()).ToList();
        Assert.Contains(BodeFigure.LoopName, sent);
        Assert.DoesNotContain(BodeFigure.IdealLoopName, sent); // switched off: not sent at all
        Assert.DoesNotContain(BodeFigure.IdealCompensatorName, sent);
    }

    [Fact]
    public void An_ideal_amplifier_design_has_no_ideal_amplifier_traces()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Form, DesignForm.FromDesign(analysis.Design)));
        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        Assert.DoesNotContain(BodeFigure.IdealLoopName, TraceNames(module.Invocations["newPlot"].Single().Arguments[1]));
        Assert.Empty(cut.FindAll("[data-trace-toggle='ideal-amplifier']"));
    }

    [Fact]
    public void The_derivation_view_lists_the_core_current_mode_steps()
    {
        var analysis = DesignAnalyzer.Analyze(PcmExample);
        Assert.Contains(analysis.Derivations, d => d.Quantity == "Current-loop crossover");
        var cut = Render<DerivationView>(p => p.Add(c => c.Derivations, analysis.Derivations));
        Assert.Contains("Current-loop crossover", cut.Markup, StringComparison.Ordinal);
        Assert.Contains("Ridley 1991", cut.Markup, StringComparison.Ordinal);
    }

    private static List<string?> TraceNames(object? data)
    {
        using var doc = JsonDocument.Parse(JsonSerializer.Serialize(data));
        return [.. doc.RootElement.EnumerateArray().Select(t => t.TryGetProperty("name", out var n) ? n.GetString() : null)];
    }

    private static LoopDesign Example(string file)
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "LoopShaper.sln")))
        {
            dir = dir.Parent;
        }

        string path = Path.Combine(dir?.FullName ?? throw new InvalidOperationException("repository root not found"), "docs", "examples", file);
        var result = DesignFile.Read(File.ReadAllText(path));
        return result.Design ?? throw new InvalidOperationException($"{file}: {string.Join("; ", result.Errors.Select(e => e.Message))}");
    }
}
