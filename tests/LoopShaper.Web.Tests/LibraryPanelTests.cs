using LoopShaper.Core.Design;
using LoopShaper.Library;
using LoopShaper.Web.Components.Controls;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopShaper.Web.Tests;

/// <summary>The library panel over a real library file: save, revisions, restore, conflicts between two people.</summary>
public sealed class LibraryPanelTests : BunitContext
{
    public LibraryPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
        TestLibrary.AddTo(Services);
        Services.AddLogging();
    }

    private DesignLibrary Library => Services.GetRequiredService<LibraryHost>().Library!;

    private static DesignWorkspace NewWorkspace() => new(TestDesigns.Demo, NullLogger.Instance);

    [Fact]
    public async Task Save_change_save_then_restore_gives_back_the_first_revision_in_the_form()
    {
        var workspace = NewWorkspace();
        string original = workspace.Form.Inductance.Text;
        var cut = Render<LibraryPanel>(p => p.Add(c => c.Workspace, workspace));
        Assert.Contains("not in the library yet", cut.Find("[data-library-status]").TextContent, StringComparison.Ordinal);

        cut.Find("[data-library-author]").Change("ana");
        cut.Find("[data-library-tags]").Change("cpu, rev-A");
        cut.Find("[data-library-message]").Change("first cut");
        await cut.Find("[data-library-save]").ClickAsync(new());
        Assert.Equal("1", cut.Find("[data-basis-revision]").TextContent);
        Assert.Equal(["cpu", "rev-A"], Library.Search(null).Single().Tags.ToArray());

        workspace.Form.Inductance.SetText("680 nH");
        cut.Find("[data-library-message]").Change("680 nH");
        await cut.Find("[data-library-save]").ClickAsync(new());
        Assert.Equal("2", cut.Find("[data-basis-revision]").TextContent);
        Assert.Equal(2, cut.FindAll("[data-library-history] tbody tr").Count);
        Assert.Equal(680e-9, Library.Read(2)!.ReadDesign().Design!.Plant is LoopShaper.Core.PlantModels.BuckPlant b ? b.PowerStage.Inductor.InductanceH : 0, 15);

        await cut.Find("[data-history-restore='1']").ClickAsync(new());
        cut.WaitForAssertion(() => Assert.Equal("3", cut.Find("[data-basis-revision]").TextContent));
        Assert.Equal(original, workspace.Form.Inductance.Text);
        Assert.Equal(Library.Read(1)!.Content, Library.Read(3)!.Content);
        Assert.Equal(Library.Read(1)!.Content, DesignFile.Write(workspace.Form.Build()));
        Assert.Equal(3, cut.FindAll("[data-library-history] tbody tr").Count);
        Assert.Contains("restored revision 1", cut.Find("[data-library-history] tr[data-revision='3']").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_second_save_from_an_old_revision_is_told_of_the_conflict_keeps_the_form_and_can_branch()
    {
        var host = Services.GetRequiredService<LibraryHost>();
        var anaSpace = NewWorkspace();
        var ana = Render<LibraryPanel>(p => p.Add(c => c.Workspace, anaSpace));
        ana.Find("[data-library-author]").Change("ana");
        await ana.Find("[data-library-save]").ClickAsync(new());

        // Ben, in another browser (his own circuit and session, the same library), opens that revision.
        using var other = new BunitContext();
        other.JSInterop.Mode = JSRuntimeMode.Strict;
        other.Services.AddSingleton(host);
        other.Services.AddScoped<LibrarySession>();
        var benSpace = NewWorkspace();
        var ben = other.Render<LibraryPanel>(p => p.Add(c => c.Workspace, benSpace));
        ben.Find("[data-library-author]").Change("ben");
        await ben.Find("[data-library-open]").ClickAsync(new());
        Assert.NotNull(ben.Find("[data-library-confirm]"));
        await ben.Find("[data-library-open]").ClickAsync(new());
        ben.WaitForAssertion(() => Assert.Equal("1", ben.Find("[data-basis-revision]").TextContent));

        // Ana saves first.
        anaSpace.Form.Inductance.SetText("390 nH");
        await ana.Find("[data-library-save]").ClickAsync(new());
        Assert.Equal("2", ana.Find("[data-basis-revision]").TextContent);

        // Ben's save is refused: nothing overwritten, his form unchanged.
        benSpace.Form.Inductance.SetText("470 nH");
        await ben.Find("[data-library-save]").ClickAsync(new());
        var conflict = ben.Find("[data-library-conflict]");
        Assert.Contains("Revision 2 was saved to branch 'main' by ana", conflict.TextContent, StringComparison.Ordinal);
        Assert.Contains("Your changes are still in the form", conflict.TextContent, StringComparison.Ordinal);
        Assert.Equal("470 nH", benSpace.Form.Inductance.Text);
        Assert.Equal(2, Library.History(1).Length);
        Assert.Equal("1", ben.Find("[data-basis-revision]").TextContent);

        Assert.Equal("ben-1", ben.Find("[data-library-branch]").GetAttribute("value"));
        await ben.Find("[data-library-save-branch]").ClickAsync(new());
        Assert.Empty(ben.FindAll("[data-library-conflict]"));
        Assert.Equal("3", ben.Find("[data-basis-revision]").TextContent);
        var saved = Library.Read(3)!;
        Assert.Equal("ben-1", saved.Info.BranchName);
        Assert.Equal(1, saved.Info.ParentId);
        Assert.Equal(DesignFile.Write(benSpace.Form.Build()), saved.Content);
        Assert.Equal(DesignFile.Write(anaSpace.Form.Build()), Library.Read(2)!.Content);
    }

    [Fact]
    public void A_library_that_cannot_be_opened_is_reported_and_the_panel_stays_usable()
    {
        string file = Path.GetTempFileName();
        try
        {
            using var other = new BunitContext();
            other.JSInterop.Mode = JSRuntimeMode.Strict;
            // A path below a regular file: its folder cannot be created.
            other.Services.AddSingleton(new LibraryHost(Path.Combine(file, "library.db"), NullLogger<LibraryHost>.Instance));
            other.Services.AddScoped<LibrarySession>();
            var cut = other.Render<LibraryPanel>(p => p.Add(c => c.Workspace, NewWorkspace()));
            Assert.Contains("could not be opened", cut.Find("[data-library-error]").TextContent, StringComparison.Ordinal);
            Assert.Empty(cut.FindAll("[data-library-save]"));
        }
        finally
        {
            File.Delete(file);
        }
    }

    [Fact]
    public async Task Search_lists_designs_by_tag_and_name()
    {
        var workspace = NewWorkspace();
        Library.AddDesign("sensor supply", TestDesigns.Demo, ["sensor"], "ben", "");
        Library.AddDesign("core rail", TestDesigns.Demo, ["cpu"], "ana", "");
        var cut = Render<LibraryPanel>(p => p.Add(c => c.Workspace, workspace));
        Assert.Equal(2, cut.FindAll("[data-library-design]").Count);
        await cut.Find("[data-library-search]").InputAsync(new Microsoft.AspNetCore.Components.ChangeEventArgs { Value = "sensor" });
        Assert.Equal("sensor supply", cut.Find("[data-library-design] td").TextContent);
        await cut.Find("[data-library-search]").InputAsync(new Microsoft.AspNetCore.Components.ChangeEventArgs { Value = "nothing-like-this" });
        Assert.Contains("No design matches", cut.Markup, StringComparison.Ordinal);
    }
}
