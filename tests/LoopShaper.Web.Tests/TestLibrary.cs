using LoopShaper.Library;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopShaper.Web.Tests;

/// <summary>A design library in a new temporary folder for a test context, and the per-circuit library session.</summary>
public sealed class TestLibrary : IDisposable
{
    // Created by the library when it is first opened; a test that never opens it leaves nothing behind.
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "loopshaper-web-library-" + Guid.NewGuid().ToString("N"));

    public TestLibrary() => Host = new LibraryHost(Path.Combine(_folder, "library.db"), NullLogger<LibraryHost>.Instance);

    /// <summary>The host the app would register.</summary>
    public LibraryHost Host { get; }

    /// <summary>The open library.</summary>
    public DesignLibrary Library => Host.Library!;

    /// <summary>Registers a new temporary library and a session in <paramref name="services"/>; the container disposes it with the test context.</summary>
    public static void AddTo(IServiceCollection services)
    {
        services.AddSingleton(_ => new TestLibrary());
        services.AddSingleton(sp => sp.GetRequiredService<TestLibrary>().Host);
        services.AddScoped<LibrarySession>();
    }

    /// <summary>Registers this library (shared, as between two people's circuits) and a new session.</summary>
    public void Register(IServiceCollection services)
    {
        services.AddSingleton(Host);
        services.AddScoped<LibrarySession>();
    }

    /// <inheritdoc />
    public void Dispose()
    {
        Host.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        try
        {
            if (Directory.Exists(_folder))
            {
                Directory.Delete(_folder, recursive: true);
            }
        }
        catch (IOException)
        {
            // Left to the OS's temp cleaning.
        }
    }
}
