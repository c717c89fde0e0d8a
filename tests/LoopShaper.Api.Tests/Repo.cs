namespace LoopShaper.Api.Tests;

/// <summary>Paths in the repository (the committed examples are posted where they are).</summary>
internal static class Repo
{
    public static string Root { get; } = FindRoot();

    public static string ExamplesDir => Path.Combine(Root, "docs", "examples");

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
