namespace LoopShaper.Cli.Tests;

/// <summary>Paths of files in the repository (the examples and docs are tested where they are committed).</summary>
internal static class RepoFiles
{
    public static string Root { get; } = FindRoot();

    public static string ExamplesDir => Path.Combine(Root, "docs", "examples");

    /// <summary>Every committed example design, by file name.</summary>
    public static TheoryData<string> Examples()
    {
        var data = new TheoryData<string>();
        foreach (var f in Directory.GetFiles(ExamplesDir, "*.json").Order(StringComparer.Ordinal))
        {
            data.Add(Path.GetFileName(f));
        }

        return data;
    }

    public static string Example(string name) => Path.Combine(ExamplesDir, name);

    private static string FindRoot()
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
