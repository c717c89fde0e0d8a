using LoopShaper.Core.Design;
using Microsoft.Data.Sqlite;

namespace LoopShaper.Library.Tests;

/// <summary>Append-only revisions, exact restore, conflicts and branches.</summary>
public sealed class RevisionTests : IDisposable
{
    private readonly TempLibrary _temp = new();

    private DesignLibrary Library => _temp.Library;

    public void Dispose() => _temp.Dispose();

    [Fact]
    public void Every_save_is_a_new_revision_and_earlier_ones_keep_their_content()
    {
        var first = Library.AddDesign("core rail", TempLibrary.CoreRail, ["cpu"], "ana", "first cut");
        Assert.Equal(SaveOutcome.Saved, first.Outcome);
        var second = Library.Save(first.Revision!.Id, TempLibrary.CoreRail.WithInductance(390e-9), "ana", "smaller inductor");
        var third = Library.Save(second.Revision!.Id, TempLibrary.CoreRail.WithInductance(220e-9), "ana", "smaller still");

        var history = Library.History(first.Revision.DesignId);
        Assert.Equal([third.Revision!.Id, second.Revision.Id, first.Revision.Id], history.Select(r => r.Id));
        Assert.Equal(second.Revision.Id, third.Revision.ParentId);
        Assert.Equal(first.Revision.Id, second.Revision.ParentId);
        Assert.Null(first.Revision.ParentId);
        Assert.Equal(DesignFile.Write(TempLibrary.CoreRail), Library.Read(first.Revision.Id)!.Content);
        Assert.Equal(390e-9, Library.Read(second.Revision.Id)!.ReadDesign().Design!.InductanceH());
        Assert.All(history, r => Assert.True(Library.Read(r.Id)!.IsIntact));
    }

    [Theory]
    [InlineData("UPDATE revisions SET content = 'x' WHERE id = 1;")]
    [InlineData("UPDATE revisions SET message = 'rewritten' WHERE id = 1;")]
    [InlineData("DELETE FROM revisions WHERE id = 1;")]
    [InlineData("DELETE FROM revisions;")]
    [InlineData("UPDATE branches SET name = 'other';")]
    [InlineData("DELETE FROM designs;")]
    public void Raw_sql_cannot_change_or_delete_a_revision(string sql)
    {
        var saved = Library.AddDesign("core rail", TempLibrary.CoreRail, [], "ana", "first cut");
        Assert.Equal(1, saved.Revision!.Id);
        string before = Library.Read(1)!.Content;

        using (var c = new SqliteConnection("Data Source=" + _temp.Path))
        {
            c.Open();
            using var q = c.CreateCommand();
            q.CommandText = sql;
            var ex = Assert.Throws<SqliteException>(() => q.ExecuteNonQuery());
            Assert.Contains("append-only", ex.Message, StringComparison.Ordinal);
        }

        Assert.Equal(before, Library.Read(1)!.Content);
        Assert.Equal("first cut", Library.Read(1)!.Info.Message);
        Assert.Single(Library.History(saved.Revision.DesignId));
    }

    [Fact]
    public void Restore_appends_a_revision_with_exactly_the_old_content()
    {
        var original = TempLibrary.Example("pol-12v-to-3v3-peak-current-mode");
        var first = Library.AddDesign("pol", original, [], "ben", "as built");
        var second = Library.Save(first.Revision!.Id, original.WithInductance(1.5e-6), "ben", "try 1.5 uH");

        var restored = Library.Restore(first.Revision.Id, second.Revision!.Id, "ben");

        Assert.Equal(SaveOutcome.Saved, restored.Outcome);
        var back = Library.Read(restored.Revision!.Id)!;
        var old = Library.Read(first.Revision.Id)!;
        Assert.Equal(old.Content, back.Content);
        Assert.Equal(System.Text.Encoding.UTF8.GetBytes(old.Content), System.Text.Encoding.UTF8.GetBytes(back.Content));
        Assert.Equal(old.Info.Sha256, back.Info.Sha256);
        Assert.Equal(first.Revision.Id, back.Info.RestoredFromId);
        Assert.Equal(second.Revision.Id, back.Info.ParentId);
        // The design read back is the design first saved: every property equal, bit for bit, and the same written form.
        var design = back.ReadDesign().Design!;
        LoopShaper.Cli.Tests.Structural.AssertEqual(original, design);
        Assert.Equal(DesignFile.Write(original), DesignFile.Write(design));
        // History keeps all three.
        Assert.Equal(3, Library.History(first.Revision.DesignId).Length);
        Assert.Equal(1.5e-6, Library.Read(second.Revision.Id)!.ReadDesign().Design!.InductanceH());
    }

    [Fact]
    public void A_save_based_on_an_old_head_is_a_conflict_and_writes_nothing()
    {
        var start = Library.AddDesign("core rail", TempLibrary.CoreRail, [], "ana", "start");
        long basis = start.Revision!.Id;
        // Two engineers opened revision 1; the first saves.
        var ana = Library.Save(basis, TempLibrary.CoreRail.WithInductance(390e-9), "ana", "390 nH");
        Assert.Equal(SaveOutcome.Saved, ana.Outcome);

        var ben = Library.Save(basis, TempLibrary.CoreRail.WithInductance(470e-9), "ben", "470 nH");

        Assert.Equal(SaveOutcome.Conflict, ben.Outcome);
        Assert.Null(ben.Revision);
        Assert.Equal(ana.Revision!.Id, ben.Head!.Id);
        Assert.Contains("ana", ben.Message, StringComparison.Ordinal);
        Assert.Contains("Nothing was overwritten", ben.Message, StringComparison.Ordinal);
        Assert.Equal(2, Library.History(start.Revision.DesignId).Length);
        Assert.Equal(390e-9, Library.Read(Library.HeadOfBranchOf(basis)!.Id)!.ReadDesign().Design!.InductanceH());

        // Ben keeps his work as a branch of the revision he started from.
        var branch = Library.SaveAsBranch(basis, "ben-470n", TempLibrary.CoreRail.WithInductance(470e-9), "ben", "470 nH");
        Assert.Equal(SaveOutcome.Saved, branch.Outcome);
        Assert.Equal("ben-470n", branch.Revision!.BranchName);
        Assert.Equal(basis, branch.Revision.ParentId);
        var branches = Library.Branches(start.Revision.DesignId);
        Assert.Equal([DesignLibrary.MainBranch, "ben-470n"], branches.Select(b => b.Name));
        Assert.Equal(ana.Revision.Id, branches[0].HeadRevisionId);
        Assert.Equal(branch.Revision.Id, branches[1].HeadRevisionId);
        Assert.Equal(basis, branches[1].ForkedFromRevisionId);
        // A second branch of the same name is refused, naming the field.
        var again = Library.SaveAsBranch(basis, "ben-470n", TempLibrary.CoreRail, "ben", "again");
        Assert.Equal(SaveOutcome.Rejected, again.Outcome);
        Assert.StartsWith("branch name:", again.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Of_many_saves_racing_from_the_same_head_in_two_processes_exactly_one_wins()
    {
        var start = Library.AddDesign("core rail", TempLibrary.CoreRail, [], "ana", "start");
        // A second library object on the same file stands for another process.
        using var other = DesignLibrary.Open(_temp.Path);
        var results = Enumerable.Range(0, 8).AsParallel().WithDegreeOfParallelism(8)
            .Select(i => (i % 2 == 0 ? Library : other).Save(start.Revision!.Id, TempLibrary.CoreRail.WithInductance((300 + i) * 1e-9), "user" + i, "race"))
            .ToList();

        Assert.Single(results, r => r.Outcome == SaveOutcome.Saved);
        Assert.Equal(7, results.Count(r => r.Outcome == SaveOutcome.Conflict));
        Assert.Equal(2, Library.History(start.Revision!.DesignId).Length);
    }

    [Fact]
    public void A_restore_onto_a_moved_branch_is_a_conflict_too()
    {
        var a = Library.AddDesign("core rail", TempLibrary.CoreRail, [], "ana", "a");
        var b = Library.Save(a.Revision!.Id, TempLibrary.CoreRail.WithInductance(390e-9), "ana", "b");
        Assert.Equal(SaveOutcome.Saved, b.Outcome);
        var r = Library.Restore(a.Revision.Id, a.Revision.Id, "ben");
        Assert.Equal(SaveOutcome.Conflict, r.Outcome);
        Assert.Equal(2, Library.History(a.Revision.DesignId).Length);
    }

    [Fact]
    public void Bad_input_is_refused_with_the_field_named()
    {
        Assert.StartsWith("library name:", Library.AddDesign("  ", TempLibrary.CoreRail, [], "", "").Message, StringComparison.Ordinal);
        Assert.StartsWith("tags:", Library.AddDesign("x", TempLibrary.CoreRail, ["a,b"], "", "").Message, StringComparison.Ordinal);
        Assert.StartsWith("message:", Library.AddDesign("x", TempLibrary.CoreRail, [], "", new string('m', DesignLibrary.MaxMessageLength + 1)).Message, StringComparison.Ordinal);
        var nan = TempLibrary.CoreRail.WithInductance(double.NaN);
        var refused = Library.AddDesign("x", nan, [], "", "");
        Assert.Equal(SaveOutcome.Rejected, refused.Outcome);
        Assert.Contains("inductanceH", refused.Message, StringComparison.Ordinal);
        Assert.Equal(SaveOutcome.Rejected, Library.Save(999, TempLibrary.CoreRail, "", "").Outcome);
        Assert.Empty(Library.Search(null));
    }
}
