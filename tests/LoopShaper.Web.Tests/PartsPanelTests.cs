using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Components.Pages;
using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Web;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Web.Tests;

/// <summary>The parts panel over the real core: ideal against standard values, the loop with both, the downloads.</summary>
public sealed class PartsPanelTests : BunitContext
{
    public PartsPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        Services.AddLogging();
    }

    /// <summary>docs/examples/industrial-24v-to-5v.json: a Type III placement with a synthesis section (E96, E12, C3 at 10 %).</summary>
    private static LoopDesign Industrial => DesignFile.Read(File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", "industrial-24v-to-5v.json"))).Design!;

    [Fact]
    public async Task Choosing_parts_shows_every_part_as_the_core_synthesised_it()
    {
        var (cut, workspace) = await RenderPanel(Industrial);
        Assert.Single(cut.FindAll("[data-parts-empty]"));
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => Assert.Equal("ready", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel")), TimeSpan.FromSeconds(20));

        // The same synthesis run directly on the core.
        Assert.True(DesignSynthesizer.TrySynthesize(workspace.Form.Build(), DesignSynthesizer.OptionsOf(Industrial), out var expected, out _));
        var s = expected!.Synthesis;
        Assert.Equal(s.Parts.Select(p => p.Designator), cut.FindAll("[data-part]").Select(r => r.GetAttribute("data-part")!));
        foreach (var p in s.Parts)
        {
            var row = cut.Find($"[data-part='{p.Designator}']");
            var chosen = s.ChosenParts.Single(c => c.Designator == p.Designator);
            Assert.Equal(Format(p.Value.IdealValue, p.Unit, 4), row.QuerySelector("[data-cell='ideal']")!.TextContent);
            Assert.Equal(Format(p.Value.Value, p.Unit, 3), row.QuerySelector("[data-cell='snapped']")!.TextContent);
            Assert.Equal(p.Value.ErrorPct.ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture) + " %", row.QuerySelector("[data-cell='snapped-error']")!.TextContent);
            Assert.Equal(Format(chosen.Value.Value, p.Unit, 3), row.QuerySelector("[data-cell='chosen']")!.TextContent);
            Assert.Equal(p.Value.Series.ToString(), row.QuerySelector("[data-cell='series']")!.TextContent);
        }

        // C3 carries the example's 10 %, C1 the section's 5 %.
        Assert.Equal("±10 %", cut.Find("[data-part='C3'] [data-cell='tolerance']").TextContent);
        Assert.Equal("±5 %", cut.Find("[data-part='C1'] [data-cell='tolerance']").TextContent);

        // The loop with ideal, snapped and searched parts side by side.
        var crossover = cut.FindAll("[data-performance='crossover'] td").Select(c => c.TextContent).ToList();
        Assert.Equal([Format(s.Ideal.CrossoverHz!.Value, "Hz"), Format(s.Snapped.CrossoverHz!.Value, "Hz"), Format(s.Search!.Performance.CrossoverHz!.Value, "Hz")], crossover);
        Assert.Equal("30.0 kHz", crossover[0]); // the example's crossover target
        var pm = cut.FindAll("[data-performance='phase-margin'] td").Select(c => c.TextContent).ToList();
        Assert.Equal(s.Snapped.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture) + " °", pm[1]);
        Assert.Equal(expected.MeetsCriteria ? "pass" : "fail", cut.Find("[data-parts-verdict]").GetAttribute("data-parts-verdict"));
    }

    [Fact]
    public async Task The_downloads_carry_the_parts_list_and_the_netlists_of_the_chosen_parts()
    {
        var (cut, workspace) = await RenderPanel(Industrial);
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => cut.Find("[data-download-parts]"), TimeSpan.FromSeconds(20));

        var link = cut.Find("[data-download-parts]");
        Assert.Equal("industrial-24-v-to-5-v-logic-rail-parts.csv", link.GetAttribute("download"));
        var entries = PartsListCsv.Parse(Decode(link.GetAttribute("href")!, "text/csv"));
        Assert.True(DesignSynthesizer.TrySynthesize(workspace.Form.Build(), DesignSynthesizer.OptionsOf(Industrial), out var expected, out _));
        Assert.Equal(expected!.Synthesis.ChosenParts.Select(p => (p.Designator, p.Value.Value, p.Tolerance.TolerancePct)), entries.Select(e => (e.Designator, e.Value, e.TolerancePct)));

        string netlist = Decode(cut.Find("[data-download-netlist]").GetAttribute("href")!, "text/plain");
        Assert.Equal(SpiceNetlist.Compensator(expected.Synthesis.ChosenNetwork, Industrial.Name), netlist);
        string loop = Decode(cut.Find("[data-download-loop-netlist]").GetAttribute("href")!, "text/plain");
        Assert.StartsWith("* LoopShaper averaged small-signal loop", loop, StringComparison.Ordinal);
    }

    /// <summary>docs/examples/pol-12v-to-3v3-peak-current-mode.json: peak current mode with an OTA Type II network (gm = 1 mS, Ro = 5 MOhm).</summary>
    private static LoopDesign CurrentModeOta => DesignFile.Read(File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", "pol-12v-to-3v3-peak-current-mode.json"))).Design!;

    [Fact]
    public async Task An_ota_compensator_gets_its_parts_anchored_on_gm_and_the_divider()
    {
        var (cut, workspace) = await RenderPanel(CurrentModeOta);
        // gm and the divider anchor an OTA network: no R1 field; the neighbour search over R2, C1, C2 is offered (on by
        // default, as for the op-amp networks).
        Assert.True(cut.Find("[data-search-neighbours]").HasAttribute("checked"));
        Assert.DoesNotContain("R1 (empty: divider top)", cut.Markup, StringComparison.Ordinal);
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => Assert.Equal("ready", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel")), TimeSpan.FromSeconds(20));
        Assert.Empty(cut.FindAll("[data-parts-error]"));

        // The same OTA synthesis run directly on the core.
        Assert.True(DesignSynthesizer.TrySynthesizeOta(workspace.Form.Build(), DesignSynthesizer.OptionsOf(CurrentModeOta), out var expected, out _));
        var s = expected!.Synthesis;
        Assert.Equal(["R2", "C1", "C2"], cut.FindAll("[data-part]").Select(r => r.GetAttribute("data-part")!));
        foreach (var p in s.Parts)
        {
            var row = cut.Find($"[data-part='{p.Designator}']");
            Assert.Equal(Format(p.Value.IdealValue, p.Unit, 4), row.QuerySelector("[data-cell='ideal']")!.TextContent);
            Assert.Equal(Format(p.Value.Value, p.Unit, 3), row.QuerySelector("[data-cell='snapped']")!.TextContent);
            Assert.Equal(p.Value.Series.ToString(), row.QuerySelector("[data-cell='series']")!.TextContent);
        }

        // The example's own 22 kOhm is E24, not E96 (IEC 60063): E96's nearest is 22.1 kOhm; 3.3 nF and 47 pF are E12.
        Assert.Equal("22.1 kOhm", cut.Find("[data-part='R2'] [data-cell='snapped']").TextContent);
        Assert.Equal("3.30 nF", cut.Find("[data-part='C1'] [data-cell='snapped']").TextContent);
        Assert.Equal("47.0 pF", cut.Find("[data-part='C2'] [data-cell='snapped']").TextContent);

        // The anchor names gm and the divider; ideal, snapped and searched loops side by side (the search is on).
        var anchor = cut.Find("[data-parts-anchor]");
        Assert.Equal("gm", anchor.GetAttribute("data-parts-anchor"));
        Assert.Contains("gm = 1.00 mS", anchor.TextContent, StringComparison.Ordinal);
        Assert.Equal(3, cut.FindAll("[data-cell='chosen']").Count);
        var crossover = cut.FindAll("[data-performance='crossover'] td").Select(c => c.TextContent).ToList();
        Assert.Equal([Format(s.Ideal.CrossoverHz!.Value, "Hz"), Format(s.Snapped.CrossoverHz!.Value, "Hz"), Format(s.Search!.Performance.CrossoverHz!.Value, "Hz")], crossover);

        // Downloads: the parts list, the OTA network, and the loop as the state-space peak current-mode plant, all with
        // the chosen parts.
        var entries = PartsListCsv.Parse(Decode(cut.Find("[data-download-parts]").GetAttribute("href")!, "text/csv"));
        Assert.Equal(s.ChosenParts.Select(p => (p.Designator, p.Value.Value)), entries.Select(e => (e.Designator, e.Value)));
        var divider = ((Core.PlantModels.BuckPlant)expected.BuiltDesign.Plant).Feedback;
        Assert.Equal(SpiceNetlist.Compensator(s.ChosenNetwork, divider, CurrentModeOta.Name), Decode(cut.Find("[data-download-netlist]").GetAttribute("href")!, "text/plain"));
        string loop = Decode(cut.Find("[data-download-loop-netlist]").GetAttribute("href")!, "text/plain");
        Assert.StartsWith("* LoopShaper loop netlist: state-space realisation of the peak current-mode CCM plant with a Type II OTA compensator", loop, StringComparison.Ordinal);
    }

    [Fact]
    public async Task An_ota_network_shows_the_chosen_columns_while_the_search_is_on()
    {
        // Three steps each way (the design's synthesis.searchSteps) let the search move C1 and C2 on this example.
        var design = CurrentModeOta with { Synthesis = new SynthesisSettings { SearchSteps = 3 } };
        var (cut, workspace) = await RenderPanel(design);
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => Assert.Equal("ready", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel")), TimeSpan.FromSeconds(20));

        Assert.True(DesignSynthesizer.TrySynthesizeOta(workspace.Form.Build(), DesignSynthesizer.OptionsOf(design), out var expected, out _));
        var s = expected!.Synthesis;
        Assert.NotNull(s.Search);
        Assert.Contains(cut.FindAll(".parts-table th"), h => h.TextContent == "Chosen");
        Assert.Contains(cut.FindAll(".perf-table th"), h => h.TextContent == "searched");
        foreach (var c in s.ChosenParts)
        {
            var row = cut.Find($"[data-part='{c.Designator}']");
            Assert.Equal(Format(c.Value.Value, c.Unit, 3), row.QuerySelector("[data-cell='chosen']")!.TextContent);
            Assert.Equal(c.Value.ErrorPct.ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture) + " %", row.QuerySelector("[data-cell='chosen-error']")!.TextContent);
        }

        // The search moved a part here, so the chosen column is not the snapped one.
        Assert.Contains(s.Parts.Zip(s.ChosenParts), x => x.First.Value.Value != x.Second.Value.Value);
        var pm = cut.FindAll("[data-performance='phase-margin'] td").Select(c => c.TextContent).ToList();
        Assert.Equal(s.Search!.Performance.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture) + " °", pm[2]);

        // Unticked: the snapped values stand, the chosen columns go, and the design keeps the setting.
        await cut.Find("[data-search-neighbours]").ChangeAsync(new ChangeEventArgs { Value = false });
        await cut.WaitForAssertionAsync(() => Assert.Empty(cut.FindAll("[data-cell='chosen']")), TimeSpan.FromSeconds(20));
        Assert.DoesNotContain(cut.FindAll(".parts-table th"), h => h.TextContent == "Chosen");
        Assert.False(workspace.Form.Build().Synthesis!.SearchNeighbours);
        Assert.Equal(2, cut.FindAll("[data-performance='crossover'] td").Count);
    }

    [Fact]
    public async Task Changing_the_series_rechooses_the_parts_and_goes_into_the_design()
    {
        var (cut, workspace) = await RenderPanel(Industrial);
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => Assert.Equal("E96", cut.Find("[data-part='R2'] [data-cell='series']").TextContent), TimeSpan.FromSeconds(20));
        string r2E96 = cut.Find("[data-part='R2'] [data-cell='chosen']").TextContent;

        await cut.Find("[data-resistor-series]").ChangeAsync(new ChangeEventArgs { Value = "E24" });
        await cut.WaitForAssertionAsync(() => Assert.Equal("E24", cut.Find("[data-part='R2'] [data-cell='series']").TextContent), TimeSpan.FromSeconds(20));
        Assert.Equal(ESeries.E24, workspace.Form.Build().Synthesis!.ResistorSeries);
        // 52.3 kOhm is not an E24 value: R1 becomes 51 kOhm (IEC 60063), and every resistor an E24 value.
        Assert.Equal("51.0 kOhm", cut.Find("[data-part='R1'] [data-cell='chosen']").TextContent);
        Assert.NotEqual(r2E96, cut.Find("[data-part='R2'] [data-cell='chosen']").TextContent);
        Assert.All(workspacePartsOf(cut).Where(p => p.Kind == PartKind.Resistor), p => Assert.True(StandardValues.IsPreferred(p.Value, ESeries.E24), p.ToString()));

        IEnumerable<PartsListEntry> workspacePartsOf(IRenderedComponent<PartsPanel> c) => PartsListCsv.Parse(Decode(c.Find("[data-download-parts]").GetAttribute("href")!, "text/csv"));
    }

    [Fact]
    public async Task R1_takes_si_prefixes_and_shows_the_validator_message_beside_the_field()
    {
        var (cut, workspace) = await RenderPanel(Industrial);
        await cut.Find("#f-synthesis-r1Ohm").InputAsync(new ChangeEventArgs { Value = "20k" });
        await cut.WaitForAssertionAsync(() => Assert.Equal("20.0 kOhm", cut.Find("[data-part='R1'] [data-cell='chosen']").TextContent), TimeSpan.FromSeconds(20));
        Assert.Equal(20e3, workspace.Form.Build().Synthesis!.R1Ohm);

        await cut.Find("#f-synthesis-r1Ohm").InputAsync(new ChangeEventArgs { Value = "0.5" });
        await cut.WaitForAssertionAsync(() => Assert.Equal("500 mOhm is out of range: allowed 1.00 Ohm to 1.00 GOhm.", cut.Find("[data-field-message='synthesis.r1Ohm']").TextContent), TimeSpan.FromSeconds(20));
        await cut.WaitForAssertionAsync(() => Assert.Contains(cut.FindAll("[data-parts-error]"), e => e.GetAttribute("data-parts-error") == "synthesis.r1Ohm"), TimeSpan.FromSeconds(20));
        Assert.Empty(cut.FindAll("[data-part]"));
    }

    [Fact]
    public async Task A_design_without_a_synthesis_section_keeps_none_until_the_panel_changes_it()
    {
        var plain = Industrial with { Synthesis = null };
        var (cut, workspace) = await RenderPanel(plain);
        Assert.Null(workspace.Form.Build().Synthesis);
        await cut.Find("[data-search-neighbours]").ChangeAsync(new ChangeEventArgs { Value = false });
        await cut.WaitForAssertionAsync(() => Assert.Equal("ready", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel")), TimeSpan.FromSeconds(20));
        Assert.False(workspace.Form.Build().Synthesis!.SearchNeighbours);
        Assert.Empty(cut.FindAll("[data-cell='chosen']"));
    }

    [Fact]
    public async Task The_workspace_page_has_the_parts_card()
    {
        PlotlyModule.Setup(this);
        JSInterop.SetupVoid("Blazor._internal.InputFile.init", _ => true);
        Services.AddSingleton<DemoDesign>();
        TestLibrary.AddTo(Services);
        SetRendererInfo(new RendererInfo("Server", true));
        var cut = Render<Designer>();
        await cut.WaitForAssertionAsync(() => cut.Find("[data-kpi-value='phase-margin']"), TimeSpan.FromSeconds(10));
        Assert.Equal("idle", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel"));

        // The demo is given by parts (E24 resistors, E12 capacitors in its synthesis section): they come back unchanged.
        await cut.Find("[data-choose-parts]").ClickAsync(new MouseEventArgs());
        await cut.WaitForAssertionAsync(() => Assert.Equal("ready", cut.Find("[data-parts-panel]").GetAttribute("data-parts-panel")), TimeSpan.FromSeconds(20));
        Assert.Equal("5.60 kOhm", cut.Find("[data-part='R2'] [data-cell='snapped']").TextContent);
        Assert.Equal("0.00 %", cut.Find("[data-part='R2'] [data-cell='snapped-error']").TextContent);
    }

    private async Task<(IRenderedComponent<PartsPanel> Cut, DesignWorkspace Workspace)> RenderPanel(LoopDesign design)
    {
        var logger = Services.GetRequiredService<ILoggerFactory>().CreateLogger("parts");
        var workspace = new DesignWorkspace(design, logger);
        await workspace.RecomputeAsync();
        var parts = new PartsWorkspace(workspace, logger);
        var cut = Render<PartsPanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Parts, parts));
        parts.Changed += () => cut.InvokeAsync(() => cut.Render());
        workspace.Changed += () => cut.InvokeAsync(() => cut.Render());
        return (cut, workspace);
    }

    private static string Decode(string href, string mediaType)
    {
        string prefix = $"data:{mediaType};charset=utf-8,";
        Assert.StartsWith(prefix, href, StringComparison.Ordinal);
        return Uri.UnescapeDataString(href[prefix.Length..]);
    }

    private static string RepoRoot()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
        {
            if (File.Exists(Path.Combine(d.FullName, "LoopShaper.sln")))
            {
                return d.FullName;
            }
        }

        throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory);
    }
}
