using System.Collections.Immutable;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopShaper.Web.Tests;

/// <summary>The tolerance fields of the Corners card: edits reach the design (file, share link, corners, Monte Carlo), the core's range messages show beside the field.</summary>
public sealed class TolerancesEditorTests : BunitContext
{
    private const string InductanceInput = "#f-tolerances-inductancePct";

    // A branch label of the demo design (docs/examples/core-rail-12v-to-1v0.json).
    private const string DemoCeramic = "ceramic 47u 6.3V 1206";

    public TolerancesEditorTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        Services.AddLogging();
    }

    [Fact]
    public async Task A_field_edit_changes_the_tolerances_of_the_design_the_file_the_link_and_the_corner_sweep()
    {
        PlotlyModule.Setup(this); // before the first render: it registers the test's JS runtime
        var workspace = await Workspace();
        Assert.Null(workspace.Form.Build().Tolerances); // the demo has no section and gains none untouched
        var cut = Render<TolerancesEditor>(p => p.Add(c => c.Workspace, workspace));
        Assert.Equal("20 %", cut.Find(InductanceInput).GetAttribute("value"));
        int before = workspace.Revision;

        await cut.Find(InductanceInput).InputAsync("5 %");
        cut.Find("#f-tolerances-esrHighFactor").Input("3");
        Eventually.True(() => workspace.Revision > before && workspace.AnalysedDesign?.Tolerances?.EsrHighFactor == 3, "the analysis of the edited design");

        var t = workspace.Analysis!.Design.Tolerances!;
        Assert.Equal(5.0, t.InductancePct);
        Assert.Equal(3.0, t.EsrHighFactor);
        Assert.Equal(ToleranceSpec.Default.CapacitancePct, t.CapacitancePct);
        // Saved and shared as the design file's "tolerances" section.
        string file = DesignFile.Write(workspace.Form.Build());
        Assert.Contains("\"inductancePct\": 5,", file, StringComparison.Ordinal);
        Assert.True(ShareToken.TryReadJson(ShareToken.FromDesign(workspace.Form.Build()), out string shared, out string error), error);
        var back = DesignFile.Read(shared).Design!;
        Assert.Equal(5.0, back.Tolerances!.InductancePct);

        // The corner sweep of the new analysis varies L by +-5 % and the ESR up to x3.
        using var watch = new CornerWatch(Services.GetRequiredService<Microsoft.Extensions.Logging.ILoggerFactory>().CreateLogger("corners")) { SettleMs = 0, Threads = 1 };
        var corners = Render<CornersPanel>(p => p.Add(c => c.Watch, watch));
        await watch.Follow(workspace.Analysis);
        Eventually.True(() => corners.Instance.Run.State == RunState.Finished, "the corner sweep");
        var parameters = corners.Instance.Table!.Parameters;
        var l = parameters.Single(p => p.Kind == ToleranceKind.Inductance);
        Assert.Equal(0.95, l.LowFactor, 1e-12);
        Assert.Equal(1.05, l.HighFactor, 1e-12);
        Assert.All(parameters.Where(p => p.Kind == ToleranceKind.Esr), p => Assert.Equal(3.0, p.HighFactor));
    }

    [Fact]
    public async Task An_out_of_range_value_shows_the_core_message_beside_the_field_and_keeps_the_typed_text()
    {
        var workspace = await Workspace();
        var cut = Render<TolerancesEditor>(p => p.Add(c => c.Workspace, workspace));
        await cut.Find(InductanceInput).InputAsync("120 %");
        cut.WaitForAssertion(() => Assert.Equal(
            "120 % is out of range: allowed 0 % to 90.0 %.",
            cut.Find("[data-field-message='tolerances.inductancePct']").TextContent));
        Assert.Equal("120 %", cut.Find(InductanceInput).GetAttribute("value"));
        Assert.Equal("true", cut.Find(InductanceInput).GetAttribute("aria-invalid"));
        Assert.False(workspace.Analysis?.IsValid ?? false);

        // A multiplier below its range, and text that is no number (kept, its own message, the last value still used).
        await cut.Find("#f-tolerances-dcrLowFactor").InputAsync("0.05");
        cut.WaitForAssertion(() => Assert.Equal("0.05 is out of range: allowed 0.1 to 1.", cut.Find("[data-field-message='tolerances.dcrLowFactor']").TextContent));
        await cut.Find("#f-tolerances-capacitancePct").InputAsync("twenty");
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-field-message='tolerances.capacitancePct']")));
        Assert.Equal("twenty", cut.Find("#f-tolerances-capacitancePct").GetAttribute("value"));
        Assert.Equal(20.0, workspace.Form.Build().Tolerances!.CapacitancePct);

        // Back in range: the message goes and the analysis is valid again.
        await cut.Find(InductanceInput).InputAsync("30 %");
        await cut.Find("#f-tolerances-dcrLowFactor").InputAsync("0.7");
        await cut.Find("#f-tolerances-capacitancePct").InputAsync("10 %");
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-field-message]")));
        Assert.True(workspace.Analysis!.IsValid);
        Assert.Equal(30.0, workspace.Analysis.Design.Tolerances!.InductancePct);
    }

    [Fact]
    public async Task A_loaded_section_is_shown_with_its_capacitor_entry()
    {
        var spec = new ToleranceSpec
        {
            InductancePct = 12.5,
            SenseGainPct = 4,
            Capacitors = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, [KeyValuePair.Create(DemoCeramic, new CapacitorTolerance(10, 0.6))]),
        };
        var workspace = new DesignWorkspace(TestDesigns.Demo with { Tolerances = spec }, NullLogger.Instance);
        await workspace.RecomputeAsync();
        var cut = Render<TolerancesEditor>(p => p.Add(c => c.Workspace, workspace));
        Assert.Equal("12.5 %", cut.Find(InductanceInput).GetAttribute("value"));
        Assert.Equal("10 %", cut.Find("#f-tolerances-capacitors-0--tolerancePct").GetAttribute("value"));
        Assert.Equal("0.6", cut.Find("#f-tolerances-capacitors-0--dcBiasFactor").GetAttribute("value"));
        Assert.Empty(cut.FindAll("[data-tolerances-kept]"));
        Assert.True(workspace.Analysis!.IsValid);
        Assert.Empty(cut.FindAll("#f-tolerances-senseGainPct")); // voltage mode: no sense gain shown, its value kept
        var built = workspace.Form.Build().Tolerances!;
        Assert.Equal(12.5, built.InductancePct);
        Assert.Equal(4.0, built.SenseGainPct);
        Assert.Equal(new CapacitorTolerance(10, 0.6), built.Capacitors[DemoCeramic]);
    }

    [Fact]
    public async Task A_branch_of_its_own_gets_an_entry_that_follows_a_rename_and_its_range_message_beside_its_field()
    {
        var workspace = await Workspace();
        var cut = Render<TolerancesEditor>(p => p.Add(c => c.Workspace, workspace));
        Assert.Equal(2, cut.FindAll("[data-branch-tolerance]").Count);

        // The second branch (the polymer) alone: its entry is the first in label order, so its paths are [0].
        var polymer = workspace.Form.Capacitors[1];
        await cut.Find("[data-branch-tolerance='1'] input[id$='dcBiasFactor']").InputAsync("1.5");
        cut.WaitForAssertion(() => Assert.Equal("1.5 is out of range: allowed 0.05 to 1.", cut.Find("[data-field-message='tolerances.capacitors[0].dcBiasFactor']").TextContent));
        Assert.Equal("1.5", cut.Find("[data-branch-tolerance='1'] input[id$='dcBiasFactor']").GetAttribute("value"));

        await cut.Find("[data-branch-tolerance='1'] input[id$='dcBiasFactor']").InputAsync("0.8");
        await cut.Find("[data-branch-tolerance='0'] input[id$='dcBiasFactor']").InputAsync("0.45");
        Eventually.True(() => workspace.Analysis is { IsValid: true } a && a.Design.Tolerances?.Capacitors.Count == 2, "the analysis with both entries");
        var t = workspace.Analysis!.Design.Tolerances!;
        Assert.Equal(new CapacitorTolerance(20, 0.45), t.Capacitors[DemoCeramic]);
        Assert.Equal(new CapacitorTolerance(20, 0.8), t.Capacitors[polymer.Label]);
        // The derating reaches the corners: the ceramic's nominal factor is its DC-bias factor.
        var c = ToleranceModel.Parameters(workspace.Analysis.Design).Single(p => p.Name == $"C[{DemoCeramic}]");
        Assert.Equal(0.45, c.NominalFactor);

        // Renamed in the bank, the entry follows the branch.
        workspace.Form.Capacitors[0].Label = "aaa ceramic";
        var built = workspace.Form.Build().Tolerances!;
        Assert.Equal(0.45, built.Capacitors["aaa ceramic"].DcBiasFactor);
        Assert.False(built.Capacitors.ContainsKey(DemoCeramic));
        Assert.Equal("tolerances.capacitors[0].dcBiasFactor", workspace.Form.Tolerances.For(workspace.Form.Capacitors[0]).DcBiasFactor.Path);
        Assert.Equal("tolerances.capacitors[1].dcBiasFactor", workspace.Form.Tolerances.For(polymer).DcBiasFactor.Path);

        // Cleared again: no entry, and the demo (no section to begin with) writes none once every field is back at its default.
        workspace.Form.Tolerances.For(workspace.Form.Capacitors[0]).DcBiasFactor.SetText(string.Empty);
        workspace.Form.Tolerances.For(polymer).DcBiasFactor.SetText(string.Empty);
        Assert.Null(workspace.Form.Build().Tolerances);
    }

    private static async Task<DesignWorkspace> Workspace()
    {
        var workspace = new DesignWorkspace(TestDesigns.Demo, NullLogger.Instance);
        await workspace.RecomputeAsync();
        return workspace;
    }
}
