using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace LoopShaper.Tests.Shared;

/// <summary>
/// The web app started as a child process on a free loopback port (`dotnet LoopShaper.Web.dll --urls http://127.0.0.1:PORT`),
/// in the Development environment so that static web assets are served from the build output's manifest. Unless the
/// arguments name a `--library`, its design library is a new temporary folder (never the user's own library), removed
/// on dispose. Shared by the browser, library and benchmark projects (linked, not referenced).
/// </summary>
public sealed class WebAppProcess : IAsyncDisposable
{
    private readonly StringBuilder _log = new();

    private WebAppProcess(Process process, Uri baseUri, string? temporaryLibrary)
    {
        Process = process;
        BaseUri = baseUri;
        LibraryPath = temporaryLibrary;
    }

    /// <summary>The child process.</summary>
    public Process Process { get; }

    /// <summary>The temporary design library the app was given, or null when the caller named its own.</summary>
    public string? LibraryPath { get; }

    /// <summary>Where the app listens, ending in a slash.</summary>
    public Uri BaseUri { get; }

    /// <summary>Everything the app wrote to stdout and stderr so far.</summary>
    public string Log
    {
        get
        {
            lock (_log)
            {
                return _log.ToString();
            }
        }
    }

    /// <summary>Starts the app built beside this repository's tests with <paramref name="arguments"/> and waits until it answers.</summary>
    public static async Task<WebAppProcess> StartAsync(params string[] arguments)
    {
        string dll = FindWebDll();
        int port = FreeLoopbackPort();
        var url = new Uri($"http://127.0.0.1:{port}/");
        var info = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = Path.GetDirectoryName(dll)!,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        info.ArgumentList.Add(dll);
        info.ArgumentList.Add("--urls");
        info.ArgumentList.Add(url.ToString().TrimEnd('/'));
        string? library = null;
        if (!arguments.Contains("--library"))
        {
            library = Path.Combine(Directory.CreateTempSubdirectory("loopshaper-test-library-").FullName, "library.db");
            info.ArgumentList.Add("--library");
            info.ArgumentList.Add(library);
        }

        foreach (string a in arguments)
        {
            info.ArgumentList.Add(a);
        }

        info.Environment["ASPNETCORE_ENVIRONMENT"] = "Development";
        info.Environment["DOTNET_NOLOGO"] = "1";
        var process = Process.Start(info) ?? throw new InvalidOperationException("could not start " + dll);
        var app = new WebAppProcess(process, url, library);
        process.OutputDataReceived += (_, e) => app.Append(e.Data);
        process.ErrorDataReceived += (_, e) => app.Append(e.Data);
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();

        using var http = new HttpClient { Timeout = TimeSpan.FromSeconds(2) };
        var deadline = DateTime.UtcNow.AddSeconds(60);
        while (DateTime.UtcNow < deadline)
        {
            if (process.HasExited)
            {
                throw new InvalidOperationException("The web app exited during start-up:\n" + app.Log);
            }

            try
            {
                using var response = await http.GetAsync(url).ConfigureAwait(false);
                if (response.StatusCode == HttpStatusCode.OK)
                {
                    return app;
                }
            }
            catch (HttpRequestException)
            {
            }
            catch (TaskCanceledException)
            {
            }

            await Task.Delay(200).ConfigureAwait(false);
        }

        await app.DisposeAsync().ConfigureAwait(false);
        throw new TimeoutException("The web app did not answer within 60 s:\n" + app.Log);
    }

    /// <summary>Kills the process and everything it started, at once (SIGKILL: no shutdown code runs).</summary>
    public async Task KillAsync()
    {
        if (!Process.HasExited)
        {
            Process.Kill(entireProcessTree: true);
            await Process.WaitForExitAsync().ConfigureAwait(false);
        }
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        await KillAsync().ConfigureAwait(false);
        Process.Dispose();
        if (LibraryPath is not null)
        {
            try
            {
                Directory.Delete(Path.GetDirectoryName(LibraryPath)!, recursive: true);
            }
            catch (IOException)
            {
                // Left to the OS's temp cleaning.
            }
        }
    }

    private void Append(string? line)
    {
        if (line is not null)
        {
            lock (_log)
            {
                _log.AppendLine(line);
            }
        }
    }

    private static int FreeLoopbackPort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }

    private static string FindWebDll()
    {
        // A published build to run instead (the browser benchmark compares two builds this way).
        if (Environment.GetEnvironmentVariable("LOOPSHAPER_WEB_DLL") is { Length: > 0 } given)
        {
            return Path.GetFullPath(given);
        }

        // tests/<project>/bin/<Configuration>/<tfm>/ -> src/LoopShaper.Web/bin/<Configuration>/<tfm>/LoopShaper.Web.dll
        var here = new DirectoryInfo(AppContext.BaseDirectory);
        string tfm = here.Name;
        string configuration = here.Parent!.Name;
        var root = here;
        while (root is not null && !File.Exists(Path.Combine(root.FullName, "LoopShaper.sln")))
        {
            root = root.Parent;
        }

        string dll = Path.Combine(root?.FullName ?? throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory), "src", "LoopShaper.Web", "bin", configuration, tfm, "LoopShaper.Web.dll");
        return File.Exists(dll) ? dll : throw new FileNotFoundException("Build src/LoopShaper.Web first.", dll);
    }
}
