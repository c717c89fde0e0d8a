using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;
using Plotly.Blazor.Traces;

namespace LoopShaper.Web.Tests;

/// <summary>The compare panel: two revisions overlaid, the differing inputs and results listed.</summary>
public sealed class ComparePanelTests : BunitContext
{
    public ComparePanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        PlotlyModule.Setup(this);
        TestLibrary.AddTo(Services);
        Services.AddLogging();
    }

    [Fact]
    public async Task Two_revisions_are_overlaid_and_only_the_changed_input_is_listed()
    {
        var library = Services.GetRequiredService<LibraryHost>().Library!;
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        var first = library.AddDesign("core rail", form.Build(), [], "ana", "first");
        form.Inductance.SetText("680 nH");
        library.Save(first.Revision!.Id, form.Build(), "ana", "680 nH");
        var workspace = new DesignWorkspace(TestDesigns.Demo, NullLogger.Instance);

        var cut = Render<ComparePanel>(p => p.Add(c => c.Workspace, workspace));
        cut.Find("[data-compare-a]").Change("1");
        cut.Find("[data-compare-b]").Change("2");
        await cut.Find("[data-compare-go]").ClickAsync(new());

        cut.WaitForAssertion(() => Assert.NotNull(cut.Find("[data-input-diff]")));
        var row = Assert.Single(cut.FindAll("[data-input-diff]"));
        Assert.Equal("$.plant.powerStage.inductor.inductanceH", row.GetAttribute("data-input-diff"));
        Assert.Contains("330 nH", row.TextContent, StringComparison.Ordinal);
        Assert.Contains("680 nH", row.TextContent, StringComparison.Ordinal);
        Assert.NotEmpty(cut.FindAll("[data-result-diff='phase margin']"));

        // The chart got both loops: magnitude and phase of A (solid) and of B (dashed), from the core's responses.
        var chart = cut.FindComponent<CompareChart>().Instance;
        var traces = chart.BodeFigure.Data.Cast<Scatter>().ToList();
        Assert.Equal(4, traces.Count);
        Assert.Equal([CompareFigure.ColorA, CompareFigure.ColorA, CompareFigure.ColorB, CompareFigure.ColorB], traces.Select(t => t.Line.Color?.ToString()));
        var shown = cut.Instance.Current!;
        Assert.NotEqual(shown.AnalysisA.Margins!.PhaseMarginDeg, shown.AnalysisB.Margins!.PhaseMarginDeg);
        Assert.Equal(4, chart.StepFigure.Data.Count);
        cut.WaitForAssertion(() => Assert.Equal(2, PlotlyModule.Calls(JSInterop).Count(i => i.Identifier == "newPlot")));
    }

    [Fact]
    public async Task The_open_design_against_its_own_revision_has_no_differences()
    {
        var library = Services.GetRequiredService<LibraryHost>().Library!;
        library.AddDesign("core rail", TestDesigns.Demo, [], "ana", "first");
        var workspace = new DesignWorkspace(TestDesigns.Demo, NullLogger.Instance);
        var cut = Render<ComparePanel>(p => p.Add(c => c.Workspace, workspace));
        cut.Find("[data-compare-a]").Change("1");
        await cut.Find("[data-compare-go]").ClickAsync(new());
        cut.WaitForAssertion(() => Assert.NotNull(cut.Find("[data-compare-same-inputs]")));
        Assert.NotNull(cut.Find("[data-compare-same-results]"));
    }

    [Fact]
    public void Input_values_are_shown_with_the_unit_their_field_name_carries()
    {
        Assert.Equal("680 nH", InputValueText.Of("$.plant.powerStage.inductor.inductanceH", "6.800000000000001E-07"));
        Assert.Equal("10.8 V", InputValueText.Of("$.plant.powerStage.inputVoltageV.min", "10.8"));
        Assert.Equal("45 deg", InputValueText.Of("$.criteria.minPhaseMarginDeg", "45"));
        Assert.Equal("absent", InputValueText.Of("$.plant.powerStage.outputCapacitors[2].label", null));
        Assert.Equal("\"ceramic\"", InputValueText.Of("$.plant.powerStage.outputCapacitors[0].label", "\"ceramic\""));
        Assert.Equal("6", InputValueText.Of("$.plant.powerStage.outputCapacitors[0].count", "6"));
        Assert.Equal("A/s", InputValueText.UnitOf("$.analysis.loadStepSlewAPerS"));
        Assert.Equal("s", InputValueText.UnitOf("$.plant.control.modulatorDelayS"));
        Assert.Equal("S", InputValueText.UnitOf("$.compensator.amplifier.transconductanceS"));
        Assert.Equal("Hz", InputValueText.UnitOf("$.compensator.zero1Hz"));
    }
}
