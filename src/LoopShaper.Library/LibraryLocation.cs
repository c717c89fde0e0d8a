namespace LoopShaper.Library;

/// <summary>Where the design library lives: a path the operator configures, or the default in the user's data folder.</summary>
public static class LibraryLocation
{
    /// <summary>Configuration key of the library path (appsettings, environment variable <c>Library__Path</c>).</summary>
    public const string ConfigurationKey = "Library:Path";

    /// <summary>Command-line key: <c>--library PATH</c> sets it.</summary>
    public const string CommandLineKey = "library";

    /// <summary>File name of the library in the default folder.</summary>
    public const string FileName = "library.db";

    /// <summary>The default: LoopShaper/library.db in the local application data folder (~/.local/share on Linux, %LOCALAPPDATA% on Windows).</summary>
    public static string DefaultPath => System.IO.Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData, Environment.SpecialFolderOption.DoNotVerify), "LoopShaper", FileName);

    /// <summary>The configured path (the command-line option first, then the configuration key), else <see cref="DefaultPath"/>; made absolute.</summary>
    public static string Resolve(string? commandLine, string? configured)
    {
        string? chosen = !string.IsNullOrWhiteSpace(commandLine) ? commandLine : !string.IsNullOrWhiteSpace(configured) ? configured : null;
        return System.IO.Path.GetFullPath(chosen ?? DefaultPath);
    }
}
