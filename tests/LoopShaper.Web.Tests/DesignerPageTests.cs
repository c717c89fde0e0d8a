using System.Globalization;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Components.Pages;
using Microsoft.Extensions.DependencyInjection;

namespace LoopShaper.Web.Tests;

/// <summary>The whole workspace page over the real core: validation beside the fields, placement, derivations.</summary>
public sealed class DesignerPageTests : BunitContext
{
    private const string InductanceId = "#f-plant-powerStage-inductor-inductanceH";

    public DesignerPageTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        PlotlyModule.Setup(this);
        JSInterop.SetupVoid("Blazor._internal.InputFile.init", _ => true);
        Services.AddSingleton<DemoDesign>();
        TestLibrary.AddTo(Services);
        Services.AddLogging();
        SetRendererInfo(new Microsoft.AspNetCore.Components.RendererInfo("Server", true));
    }

    [Fact]
    public void An_out_of_range_value_shows_the_core_message_beside_its_field_and_keeps_the_text()
    {
        var cut = RenderReady();
        cut.Find(InductanceId).Input("5 H");

        // Message from LoopShaper.Core.Validation.DesignValidator (allowed 1 nH to 1 H).
        cut.WaitForAssertion(() =>
        {
            var message = cut.Find("[data-field-message='plant.powerStage.inductor.inductanceH']");
            Assert.Equal("5.00 H is out of range: allowed 1.00 nH to 1.00 H.", message.TextContent);
        });
        Assert.Equal("5 H", cut.Find(InductanceId).GetAttribute("value"));
        Assert.Contains("input errors", cut.Find("[data-panel-message='bode']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Text_that_is_not_a_number_is_kept_and_explained_and_the_analysis_uses_the_last_readable_value()
    {
        var cut = RenderReady();
        string pmBefore = Pm(cut);
        cut.Find(InductanceId).Input("4.7 uF");

        cut.WaitForAssertion(() =>
            Assert.Equal("'4.7 uF' has an unknown prefix or a unit other than H; allowed prefixes p n u m k M G.", cut.Find("[data-field-message='plant.powerStage.inductor.inductanceH']").TextContent));
        Assert.Equal("4.7 uF", cut.Find(InductanceId).GetAttribute("value"));
        // The page renders once the recompute has finished (Designer handles its events that way).
        cut.WaitForAssertion(() => Assert.Contains("1 field(s) cannot be read", cut.Markup, StringComparison.Ordinal));
        Assert.Equal(pmBefore, Pm(cut));
    }

    [Fact]
    public void Si_prefixes_are_read_and_the_margins_follow()
    {
        var cut = RenderReady();
        string pmBefore = Pm(cut);
        cut.Find(InductanceId).Input("2.2u");
        var page = cut.Instance;

        cut.WaitForAssertion(() => Assert.NotEqual(pmBefore, Pm(cut)));
        Assert.Equal(2.2e-6, page.Workspace.Form.Inductance.Value!.Value, 15);
        Assert.Equal(2.2e-6, page.Workspace.AnalysedDesign!.Plant is LoopShaper.Core.PlantModels.BuckPlant b ? b.PowerStage.Inductor.InductanceH : 0, 15);
    }

    [Fact]
    public void The_derivation_view_shows_the_numbers_of_the_current_design()
    {
        var cut = RenderReady();

        // Closed until asked for: nothing of the table renders with every keystroke.
        Assert.Empty(cut.FindAll("[data-derivation]"));
        Assert.Equal("false", cut.Find("[data-derivations-toggle]").GetAttribute("aria-expanded"));
        cut.Find("[data-derivations-toggle]").Click();
        cut.WaitForAssertion(() => Assert.Equal("true", cut.Find("[data-derivations-toggle]").GetAttribute("aria-expanded")));
        var row = cut.Find("[data-derivation='Ideal duty cycle']");
        Assert.Contains("D0 = 1.00 V / 12.0 V", row.TextContent, StringComparison.Ordinal);
        Assert.Contains("0.0833", row.TextContent, StringComparison.Ordinal); // 1.0 / 12, by hand

        cut.Find("#f-plant-powerStage-inputVoltageV-nominal").Input("12.5");
        cut.WaitForAssertion(() =>
        {
            var changed = cut.Find("[data-derivation='Ideal duty cycle']");
            Assert.Contains("D0 = 1.00 V / 12.5 V", changed.TextContent, StringComparison.Ordinal);
            Assert.Contains("0.0800", changed.TextContent, StringComparison.Ordinal); // 1.0 / 12.5, by hand
        });
        Assert.Contains(cut.FindAll("[data-derivation]"), r => r.TextContent.Contains("Erickson & Maksimovic", StringComparison.Ordinal));

        // The filter typed into it stays through closing and opening the card again.
        int all = cut.Instance.Workspace.Analysis!.Derivations.Length;
        cut.Find("#derivations input.filter").Input("duty");
        cut.WaitForAssertion(() => Assert.InRange(cut.FindAll("[data-derivation]").Count, 1, all - 1));
        int filtered = cut.FindAll("[data-derivation]").Count;
        cut.Find("[data-derivations-toggle]").Click();
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-derivation]")));
        cut.Find("[data-derivations-toggle]").Click();
        cut.WaitForAssertion(() => Assert.Equal(filtered, cut.FindAll("[data-derivation]").Count));
        Assert.Equal("duty", cut.Find("#derivations input.filter").GetAttribute("value"));
    }

    [Fact]
    public void The_slider_of_a_zero_moves_it_on_a_log_scale_and_the_model_follows()
    {
        var cut = RenderReady();
        var page = cut.Instance;
        UsePlacement(cut);
        var slider = cut.Find("[data-target='Zero1'] .placement-slider");

        // Analysis range 10 Hz .. 2 MHz: the middle of the slider is the geometric mean, sqrt(10 x 2e6) = 4.472 kHz.
        slider.Input((Placement.SliderSteps / 2).ToString(CultureInfo.InvariantCulture));
        cut.WaitForAssertion(() => Assert.Equal(4472, page.Workspace.Form.Zero1.Value!.Value, 0));
        Assert.Equal("4.472 kHz", page.Workspace.Form.Zero1.Text);
        cut.WaitForAssertion(() => Assert.Equal(4472, ((LoopShaper.Core.Compensators.CompensatorPlacement)page.Workspace.AnalysedDesign!.Compensator).Zero1Hz!.Value, 0));
    }

    [Fact]
    public void Arrow_keys_nudge_the_selected_zero_by_a_fiftieth_of_a_decade()
    {
        var cut = RenderReady();
        var page = cut.Instance;
        UsePlacement(cut);
        double z2 = page.Workspace.Form.Zero2.Value!.Value;
        cut.Find("[data-handle='Zero2']").Click();
        // Selected in the model at once, and in the chart (which takes the keys) when the page has rendered again.
        cut.WaitForAssertion(() => Assert.Equal(PlacementTarget.Zero2, page.Workspace.Selected));
        cut.WaitForAssertion(() => Assert.Equal("true", cut.Find("[data-handle='Zero2']").GetAttribute("aria-pressed")));

        cut.Find(".bode").KeyDown(new Microsoft.AspNetCore.Components.Web.KeyboardEventArgs { Key = "ArrowRight" });
        cut.WaitForAssertion(() => Assert.Equal(z2 * Math.Pow(10, 0.02), page.Workspace.Form.Zero2.Value!.Value, tolerance: 1e-3 * z2)); // 4 significant digits kept

        cut.Find(".bode").KeyDown(new Microsoft.AspNetCore.Components.Web.KeyboardEventArgs { Key = "ArrowLeft", ShiftKey = true });
        cut.WaitForAssertion(() => Assert.Equal(z2 * Math.Pow(10, 0.02 - 0.1), page.Workspace.Form.Zero2.Value!.Value, tolerance: 1e-3 * z2)); // 4 significant digits kept
    }

    [Fact]
    public void Clicking_a_marker_on_the_chart_selects_its_quantity()
    {
        var cut = RenderReady();
        var page = cut.Instance;
        UsePlacement(cut);
        var chart = cut.FindComponent<BodeChart>();
        var hit = chart.Instance.Figure.Hits.Single(h => h.Target == PlacementTarget.Pole1);
        var plotly = chart.FindComponent<Plotly.Blazor.PlotlyChart>().Instance;

        plotly.ClickEvent([new Plotly.Blazor.Interop.EventDataPoint { CurveNumber = hit.TraceIndex, PointIndex = hit.PointIndex }]);

        cut.WaitForAssertion(() => Assert.Equal(PlacementTarget.Pole1, page.Workspace.Selected));
        Assert.Equal("true", cut.Find("[data-handle='Pole1']").GetAttribute("aria-pressed"));
    }

    [Fact]
    public void Removing_a_capacitor_branch_renumbers_the_paths_the_core_reports()
    {
        var cut = RenderReady();
        var page = cut.Instance;
        cut.Find("button[aria-label='Remove capacitor branch 1']").Click();
        cut.WaitForAssertion(() => Assert.Single(page.Workspace.Form.Capacitors));
        Assert.Equal("plant.powerStage.outputCapacitors[0].esrOhm", page.Workspace.Form.Capacitors[0].Esr.Path);

        cut.Find("#f-plant-powerStage-outputCapacitors-0--esrOhm").Input("500");
        cut.WaitForAssertion(() => Assert.Equal(
            "500 Ohm is out of range: allowed 0 Ohm to 100 Ohm.",
            cut.Find("[data-field-message='plant.powerStage.outputCapacitors[0].esrOhm']").TextContent));
    }

    [Fact]
    public void The_summary_shows_the_core_figures_and_the_safety_notice()
    {
        var cut = RenderReady();
        var a = cut.Instance.Workspace.Analysis!;
        Assert.Equal(a.OperatingPoint!.DutyCycle.ToString("F3", CultureInfo.InvariantCulture), cut.Find("[data-kpi-value='duty-cycle']").TextContent);
        Assert.Equal(a.Margins!.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture) + " °", Pm(cut));
        Assert.Equal("stable", cut.Find("[data-kpi-value='stability']").TextContent);
        Assert.Equal(LoopShaper.Core.Design.DesignAnalysis.SafetyNotice, cut.Find("[data-safety-notice]").TextContent);

        // The demo meets every criterion: the list waits behind its button, and the button shows all of them.
        Assert.True(a.MeetsCriteria);
        Assert.Empty(cut.FindAll("[data-criterion]"));
        Assert.Equal("false", cut.Find("[data-criteria-toggle]").GetAttribute("aria-expanded"));
        // (a click waits in the queue while a background redraw holds the renderer: asserted once it has rendered)
        cut.Find("[data-criteria-toggle]").Click();
        cut.WaitForAssertion(() => Assert.Equal(a.Criteria.Length, cut.FindAll("[data-criterion]").Count));
        Assert.Equal("true", cut.Find("[data-criteria-toggle]").GetAttribute("aria-expanded"));
        cut.Find("[data-criteria-toggle]").Click();
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-criterion]")));
    }

    [Fact]
    public void A_failed_criterion_opens_the_criteria_list_with_it_marked()
    {
        var cut = RenderReady();
        double pm = cut.Instance.Workspace.Analysis!.Margins!.PhaseMarginDeg!.Value;
        string asked = Math.Ceiling(pm + 10).ToString(CultureInfo.InvariantCulture);
        cut.Find("#f-criteria-minPhaseMarginDeg").Input(asked);
        cut.WaitForAssertion(() => Assert.Equal("fail", cut.Find("[data-verdict]").GetAttribute("data-verdict")));
        var failed = cut.Find("[data-criterion='criteria.minPhaseMarginDeg']");
        Assert.Equal("fail", failed.ClassName);
        Assert.Contains("(>= " + asked + " deg)", failed.TextContent, StringComparison.Ordinal);
        Assert.Equal("true", cut.Find("[data-criteria-toggle]").GetAttribute("aria-expanded"));
    }

    [Fact]
    public void A_hazardous_input_voltage_shows_the_core_warning()
    {
        var cut = RenderReady();
        cut.Find("#f-plant-powerStage-inputVoltageV-max").Input("72");
        cut.WaitForAssertion(() => Assert.Contains(cut.FindAll("[data-warning]"), w => w.TextContent.StartsWith("HAZARDOUS VOLTAGE", StringComparison.Ordinal)));
    }

    [Fact]
    public void A_change_redraws_the_loop_gain_and_step_charts_in_one_message_with_the_new_analysis()
    {
        var cut = RenderReady();
        Eventually.True(() => cut.Instance.Redraws.MemberCount == 2, "both charts drawn and in the redraw group");
        int before = ReactAlls().Count;
        cut.Find(InductanceId).Input("390 nH");

        Eventually.True(() => ReactAlls().Count == before + 1, "one reactAll for the change");
        Assert.Equal(390e-9, cut.Instance.Workspace.Analysis!.Design.Plant is LoopShaper.Core.PlantModels.BuckPlant b ? b.PowerStage.Inductor.InductanceH : 0, 12);
        using var doc = System.Text.Json.JsonDocument.Parse(System.Text.Json.JsonSerializer.Serialize(ReactAlls()[^1].Arguments[0]));
        var sent = doc.RootElement.EnumerateArray().ToDictionary(r => r.GetProperty("Id").GetString()!, r => r.GetProperty("Data"));
        Assert.Equal(["bode-chart", "step-chart"], sent.Keys.Order());

        // The loop-gain chart's loop trace is the new analysis's loop response (BodeFigure keeps the core's points on its curve).
        var loop = sent["bode-chart"].EnumerateArray().Single(t => t.GetProperty("name").GetString() == LoopShaper.Web.Model.Charts.BodeFigure.LoopName);
        var response = cut.Instance.Workspace.Analysis!.LoopResponse!;
        double f0 = loop.GetProperty("x")[0].GetDouble(), m0 = loop.GetProperty("y")[0].GetDouble();
        int i0 = response.FrequencyHz.IndexOf(response.FrequencyHz.MinBy(f => Math.Abs(f - f0)));
        Assert.Equal(response.MagnitudeDb[i0], m0, 1e-2);
        Assert.DoesNotContain(Calls(), i => i.Identifier == "react" && i.Arguments[0] is "bode-chart" or "step-chart");
    }

    private List<Bunit.JSRuntimeInvocation> ReactAlls() => [.. Calls().Where(i => i.Identifier == "reactAll")];

    private List<Bunit.JSRuntimeInvocation> Calls() => PlotlyModule.Calls(JSInterop);

    private static string Pm(IRenderedComponent<Designer> cut) => cut.Find("[data-kpi-value='phase-margin']").TextContent;

    [Fact]
    public void Switching_from_parts_to_frequencies_keeps_the_loop()
    {
        var cut = RenderReady();
        string pm = Pm(cut);
        string fc = cut.Find("[data-kpi-value='crossover']").TextContent;
        UsePlacement(cut);
        Assert.Equal(CompensatorMode.Placement, cut.Instance.Workspace.Form.Mode);
        Assert.Equal(pm, Pm(cut));
        Assert.Equal(fc, cut.Find("[data-kpi-value='crossover']").TextContent);
    }

    // The demo's compensator is given by parts; the frequency controls appear after switching (the core resolves the placement).
    private static void UsePlacement(IRenderedComponent<Designer> cut)
    {
        if (cut.Instance.Workspace.Form.Mode == CompensatorMode.Placement)
        {
            return;
        }

        int revision = cut.Instance.Workspace.Revision;
        cut.Find("[data-use-placement]").Click();
        // The loop-gain chart's handles too: the editor shows its controls on its own render, the chart with the page's.
        cut.WaitForAssertion(() => Assert.True(cut.Instance.Workspace.Revision > revision && cut.FindAll("[data-target='Zero1']").Count == 1 && cut.FindAll("[data-handle='Zero1']").Count == 1));
    }

    private IRenderedComponent<Designer> RenderReady()
    {
        var cut = Render<Designer>();
        cut.WaitForAssertion(() => cut.Find("[data-kpi-value='phase-margin']"), TimeSpan.FromSeconds(10));
        return cut;
    }
}
