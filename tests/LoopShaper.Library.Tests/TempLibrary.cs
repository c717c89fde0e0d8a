using LoopShaper.Core.Design;

namespace LoopShaper.Library.Tests;

/// <summary>A library in a new temporary folder, deleted afterwards; and the example designs to fill it with.</summary>
public sealed class TempLibrary : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("loopshaper-library-").FullName;

    public TempLibrary()
    {
        Path = System.IO.Path.Combine(_folder, "library.db");
        Library = DesignLibrary.Open(Path);
    }

    /// <summary>The library file.</summary>
    public string Path { get; }

    /// <summary>The open library.</summary>
    public DesignLibrary Library { get; }

    /// <summary>An example design of docs/examples, by file name without extension.</summary>
    public static LoopDesign Example(string name)
    {
        string file = System.IO.Path.Combine(AppContext.BaseDirectory, "examples", name + ".json");
        return DesignFile.Read(File.ReadAllText(file)).Design ?? throw new InvalidOperationException(file + " does not read");
    }

    /// <summary>The processor-core rail example.</summary>
    public static LoopDesign CoreRail => Example("core-rail-12v-to-1v0");

    /// <inheritdoc />
    public void Dispose()
    {
        Library.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        try
        {
            Directory.Delete(_folder, recursive: true);
        }
        catch (IOException)
        {
            // Left to the OS's temp cleaning.
        }
    }
}
