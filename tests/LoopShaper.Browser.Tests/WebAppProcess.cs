using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace LoopShaper.Browser.Tests;

/// <summary>
/// The web app started as a child process on a free loopback port (`dotnet LoopShaper.Web.dll --urls http://127.0.0.1:PORT`),
/// in the Development environment so that static web assets are served from the build output's manifest, with its
/// design library in a new temporary folder (never the user's own library).
/// </summary>
public sealed class WebAppProcess : IAsyncDisposable
{
    private readonly Process _process;
    private readonly StringBuilder _log = new();

    private WebAppProcess(Process process, Uri baseUri, string libraryPath)
    {
        _process = process;
        BaseUri = baseUri;
        LibraryPath = libraryPath;
    }

    /// <summary>The app's design library file, in a temporary folder removed on dispose.</summary>
    public string LibraryPath { get; }

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

    /// <summary>Starts the app built beside this repository's tests and waits until it answers.</summary>
    public static async Task<WebAppProcess> StartAsync()
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
        string library = Path.Combine(Directory.CreateTempSubdirectory("loopshaper-browser-library-").FullName, "library.db");
        info.ArgumentList.Add("--library");
        info.ArgumentList.Add(library);
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

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
            await _process.WaitForExitAsync().ConfigureAwait(false);
        }

        _process.Dispose();
        try
        {
            Directory.Delete(Path.GetDirectoryName(LibraryPath)!, recursive: true);
        }
        catch (IOException)
        {
            // Left to the OS's temp cleaning.
        }
    }

    private void Append(string? line)
    {
        if (line is null)
        {
            return;
        }

        lock (_log)
        {
            _log.AppendLine(line);
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
        // tests/<project>/bin/<Configuration>/<tfm>/ -> src/LoopShaper.Web/bin/<Configuration>/<tfm>/LoopShaper.Web.dll
        var here = new DirectoryInfo(AppContext.BaseDirectory);
        string tfm = here.Name;
        string configuration = here.Parent!.Name;
        var root = here;
        while (root is not null && !File.Exists(Path.Combine(root.FullName, "LoopShaper.sln")))
        {
            root = root.Parent;
        }

        if (root is null)
        {
            throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory);
        }

        string dll = Path.Combine(root.FullName, "src", "LoopShaper.Web", "bin", configuration, tfm, "LoopShaper.Web.dll");
        return File.Exists(dll) ? dll : throw new FileNotFoundException("Build src/LoopShaper.Web first.", dll);
    }
}
