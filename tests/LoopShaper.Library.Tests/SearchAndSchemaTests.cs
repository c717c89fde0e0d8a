using Microsoft.Data.Sqlite;

namespace LoopShaper.Library.Tests;

/// <summary>Search by name, tag and description; tags; the schema version and the file's journal mode.</summary>
public sealed class SearchAndSchemaTests : IDisposable
{
    private readonly TempLibrary _temp = new();

    private DesignLibrary Library => _temp.Library;

    public void Dispose() => _temp.Dispose();

    private void Fill()
    {
        Library.AddDesign("core rail", TempLibrary.CoreRail, ["cpu", "board-A"], "ana", "first");
        Library.AddDesign("sensor supply", TempLibrary.Example("sensor-24v-to-5v-light-load-dcm"), ["sensor"], "ben", "light load");
        Library.AddDesign("usb rail", TempLibrary.Example("usb-5v-to-3v3-diode"), ["board-A"], "ben", "diode rectifier");
    }

    [Fact]
    public void Search_finds_by_name_tag_description_and_message_every_word_needed()
    {
        Fill();
        Assert.Equal(["core rail"], Library.Search("CORE").Select(d => d.Name));
        Assert.Equal(["usb rail", "core rail"], Library.Search("board-a").Select(d => d.Name));
        Assert.Equal(["usb rail"], Library.Search("board-A rail usb").Select(d => d.Name));
        Assert.Equal(["sensor supply"], Library.Search("light").Select(d => d.Name));
        Assert.Equal(3, Library.Search("").Length);
        Assert.Empty(Library.Search("%"));
        Assert.Empty(Library.Search("board_A"));
        // Words of the design's own description are found (the example's description names its processor core).
        string word = TempLibrary.CoreRail.Description.Split(' ', StringSplitOptions.RemoveEmptyEntries).First(w => w.Length > 6);
        Assert.Contains("core rail", Library.Search(word).Select(d => d.Name));
    }

    [Fact]
    public void Tags_are_replaced_as_a_set_ignoring_case_duplicates()
    {
        var saved = Library.AddDesign("core rail", TempLibrary.CoreRail, ["cpu", "CPU", " rev-B "], "ana", "first");
        long id = saved.Revision!.DesignId;
        Assert.Equal(["cpu", "rev-B"], Library.Design(id)!.Tags.ToArray());
        Assert.Null(Library.SetTags(id, ["released", "cpu"]));
        Assert.Equal(["cpu", "released"], Library.Design(id)!.Tags.ToArray());
        Assert.StartsWith("tags:", Library.SetTags(id, ["a,b"]), StringComparison.Ordinal);
        Assert.Equal(["cpu", "released"], Library.Design(id)!.Tags.ToArray());
        Assert.Empty(Library.Search("rev-B"));
        Assert.Single(Library.Search("released"));
    }

    [Fact]
    public void The_file_is_in_wal_mode_with_schema_version_1_and_reopens_with_its_data()
    {
        Library.AddDesign("core rail", TempLibrary.CoreRail, [], "ana", "first");
        Assert.Equal(1, Library.SchemaVersion);
        using (var c = new SqliteConnection("Data Source=" + _temp.Path))
        {
            c.Open();
            using var q = c.CreateCommand();
            q.CommandText = "PRAGMA journal_mode;";
            Assert.Equal("wal", q.ExecuteScalar());
        }

        using var again = DesignLibrary.Open(_temp.Path);
        Assert.Single(again.Search(null));
        Assert.Equal(1, again.SchemaVersion);
    }

    [Fact]
    public void A_library_of_a_newer_schema_is_refused()
    {
        using (var c = new SqliteConnection("Data Source=" + _temp.Path))
        {
            c.Open();
            using var q = c.CreateCommand();
            q.CommandText = "INSERT INTO schema_version (version, applied_utc) VALUES (99, '2030-01-01');";
            q.ExecuteNonQuery();
        }

        var ex = Assert.Throws<InvalidOperationException>(() => DesignLibrary.Open(_temp.Path));
        Assert.Contains("schema version 99", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_default_path_is_in_the_local_application_data_folder_unless_configured()
    {
        string expected = Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData, Environment.SpecialFolderOption.DoNotVerify), "LoopShaper", "library.db");
        Assert.Equal(Path.GetFullPath(expected), LibraryLocation.Resolve(null, null));
        Assert.Equal(Path.GetFullPath("/tmp/a.db"), LibraryLocation.Resolve("/tmp/a.db", "/tmp/b.db"));
        Assert.Equal(Path.GetFullPath("/tmp/b.db"), LibraryLocation.Resolve(" ", "/tmp/b.db"));
    }
}
