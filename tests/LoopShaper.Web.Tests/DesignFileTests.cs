using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using Microsoft.Extensions.DependencyInjection;

namespace LoopShaper.Web.Tests;

/// <summary>Open, save and share: nothing half-loaded, links that give back the same design.</summary>
public sealed class DesignFileTests : BunitContext
{
    public DesignFileTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        JSInterop.SetupVoid("Blazor._internal.InputFile.init", _ => true);
        Services.AddLogging();
    }

    [Fact]
    public void The_form_gives_back_the_design_it_was_made_from()
    {
        var design = TestDesigns.Demo;
        Assert.Equal(DesignFile.Write(design), DesignFile.Write(DesignForm.FromDesign(design).Build()));
    }

    [Fact]
    public void A_share_token_reopens_exactly_the_same_design()
    {
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        form.Inductance.SetText("1.234 uH");
        var design = form.Build();

        string token = ShareToken.FromDesign(design);
        Assert.Matches("^[A-Za-z0-9_-]+$", token);
        Assert.True(ShareToken.TryReadJson(token, out var json, out _));
        var back = DesignFile.Read(json);
        Assert.NotNull(back.Design);
        Assert.Equal(DesignFile.Write(design), DesignFile.Write(back.Design!));
    }

    [Fact]
    public void A_damaged_token_is_refused_with_a_message()
    {
        Assert.False(ShareToken.TryReadJson("not*base64", out _, out var error));
        Assert.Contains("damaged", error, StringComparison.Ordinal);
        Assert.False(ShareToken.TryReadJson("AAAA", out _, out error));
        Assert.Contains("damaged", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_broken_file_lists_every_error_with_its_path_and_changes_nothing()
    {
        var workspace = new DesignWorkspace(TestDesigns.Demo, Services.GetRequiredService<Microsoft.Extensions.Logging.ILoggerFactory>().CreateLogger("t"));
        await workspace.RecomputeAsync();
        var before = DesignFile.Write(workspace.Form.Build());
        string broken = System.Text.RegularExpressions.Regex.Replace(DesignFile.Write(TestDesigns.Demo), "\"inductanceH\": [^,}\\n]+", "\"inductanceH\": \"lots\"");
        Assert.Contains("\"lots\"", broken, StringComparison.Ordinal);

        var cut = Render<DesignFilePanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Demo, TestDesigns.Demo));
        await cut.InvokeAsync(() => cut.Instance.OpenTextAsync("broken.json", broken));

        var errors = cut.FindAll("[data-open-error]");
        Assert.NotEmpty(errors);
        Assert.Contains(errors, e => e.GetAttribute("data-open-error")!.Contains("plant.powerStage.inductor.inductanceH", StringComparison.Ordinal));
        Assert.Contains("Nothing was changed", cut.Find("[data-open-errors]").TextContent, StringComparison.Ordinal);
        Assert.Equal(before, DesignFile.Write(workspace.Form.Build()));
    }

    [Fact]
    public async Task A_good_file_replaces_the_design()
    {
        var workspace = new DesignWorkspace(TestDesigns.Demo, Services.GetRequiredService<Microsoft.Extensions.Logging.ILoggerFactory>().CreateLogger("t"));
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        form.Name = "Opened rail";
        form.SwitchingFrequency.SetText("400k");
        var cut = Render<DesignFilePanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Demo, TestDesigns.Demo));
        await cut.InvokeAsync(() => cut.Instance.OpenTextAsync("good.json", DesignFile.Write(form.Build())));

        Assert.Empty(cut.FindAll("[data-open-error]"));
        Assert.Equal("Opened rail", workspace.Form.Name);
        Assert.Equal("400 kHz", workspace.Form.SwitchingFrequency.Text);
        Assert.NotNull(workspace.Analysis);
    }

    [Fact]
    public async Task Save_offers_the_file_and_a_link_with_the_current_design()
    {
        var workspace = new DesignWorkspace(TestDesigns.Demo, Services.GetRequiredService<Microsoft.Extensions.Logging.ILoggerFactory>().CreateLogger("t"));
        await workspace.RecomputeAsync();
        workspace.Form.Inductance.SetText("820n");
        var cut = Render<DesignFilePanel>(p => p.Add(c => c.Workspace, workspace).Add(c => c.Demo, TestDesigns.Demo));
        cut.Find("[data-save-menu]").Click();

        string link = cut.Find("[data-share-link]").GetAttribute("value")!;
        string href = cut.Find("[data-download-design]").GetAttribute("href")!;
        string token = link[(link.IndexOf("?d=", StringComparison.Ordinal) + 3)..];
        Assert.Equal("design-file?d=" + token, href);
        Assert.True(ShareToken.TryReadJson(token, out var json, out _));
        var saved = DesignFile.Read(json).Design!;
        Assert.Equal(workspace.Form.Inductance.Value, ((LoopShaper.Core.PlantModels.BuckPlant)saved.Plant).PowerStage.Inductor.InductanceH);
        Assert.Equal(820e-9, workspace.Form.Inductance.Value!.Value, 1e-15);
    }
}
