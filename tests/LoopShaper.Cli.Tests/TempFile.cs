namespace LoopShaper.Cli.Tests;

/// <summary>A file in a fresh temporary directory, deleted with it.</summary>
internal sealed class TempFile : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("loopshaper-cli-tests-").FullName;

    public TempFile(string name, string? content = null)
    {
        Path = System.IO.Path.Combine(_dir, name);
        if (content is not null)
        {
            File.WriteAllText(Path, content);
        }
    }

    public string Path { get; }

    public void Dispose() => Directory.Delete(_dir, recursive: true);
}
