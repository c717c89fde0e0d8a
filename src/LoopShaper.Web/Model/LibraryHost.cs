using LoopShaper.Library;

namespace LoopShaper.Web.Model;

/// <summary>
/// The app's design library, opened on first use. When the file cannot be opened (an unwritable folder, a file of a
/// newer schema) the workspace keeps working and the library panel says why.
/// </summary>
public sealed class LibraryHost : IDisposable
{
    private readonly Lazy<(DesignLibrary? Library, string? Error)> _open;

    /// <summary>A host for the library at <paramref name="path"/>.</summary>
    public LibraryHost(string path, ILogger<LibraryHost> logger)
    {
        Path = path;
        _open = new(() =>
        {
            try
            {
                var library = DesignLibrary.Open(path);
                if (logger.IsEnabled(LogLevel.Information))
                {
                    logger.LogInformation("Design library: {Path}", path);
                }

                return (library, null);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or InvalidOperationException or Microsoft.Data.Sqlite.SqliteException)
            {
                logger.LogError(ex, "The design library {Path} could not be opened", path);
                return (null, $"The design library {path} could not be opened: {ex.Message}");
            }
        }, LazyThreadSafetyMode.ExecutionAndPublication);
    }

    /// <summary>The library file.</summary>
    public string Path { get; }

    /// <summary>The open library, or null when it could not be opened (see <see cref="Error"/>).</summary>
    public DesignLibrary? Library => _open.Value.Library;

    /// <summary>Why the library could not be opened, or null.</summary>
    public string? Error => _open.Value.Error;

    /// <inheritdoc />
    public void Dispose()
    {
        if (_open.IsValueCreated)
        {
            _open.Value.Library?.Dispose();
        }
    }
}
