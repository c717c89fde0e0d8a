using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace LoopShaper.Library.Tests;

/// <summary>The web app as a child process (`dotnet LoopShaper.Web.dll`) on a free loopback port, with extra arguments.</summary>
public sealed class AppProcess : IAsyncDisposable
{
    private readonly StringBuilder _log = new();

    private AppProcess(Process process, Uri baseUri)
    {
        Process = process;
        BaseUri = baseUri;
    }

    /// <summary>The child process.</summary>
    public Process Process { get; }

    /// <summary>Where it listens, ending in a slash.</summary>
    public Uri BaseUri { get; }

    /// <summary>What it wrote so far.</summary>
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

    /// <summary>Starts the app built beside these tests with <paramref name="arguments"/> and waits until it answers.</summary>
    public static async Task<AppProcess> StartAsync(params string[] arguments)
    {
        string dll = FindWebDll();
        int port;
        using (var listener = new TcpListener(IPAddress.Loopback, 0))
        {
            listener.Start();
            port = ((IPEndPoint)listener.LocalEndpoint).Port;
        }

        var url = new Uri($"http://127.0.0.1:{port}/");
        var info = new ProcessStartInfo("dotnet") { WorkingDirectory = Path.GetDirectoryName(dll)!, RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        info.ArgumentList.Add(dll);
        info.ArgumentList.Add("--urls");
        info.ArgumentList.Add(url.ToString().TrimEnd('/'));
        foreach (string a in arguments)
        {
            info.ArgumentList.Add(a);
        }

        info.Environment["ASPNETCORE_ENVIRONMENT"] = "Development";
        info.Environment["DOTNET_NOLOGO"] = "1";
        var app = new AppProcess(Process.Start(info) ?? throw new InvalidOperationException("could not start " + dll), url);
        app.Process.OutputDataReceived += (_, e) => app.Append(e.Data);
        app.Process.ErrorDataReceived += (_, e) => app.Append(e.Data);
        app.Process.BeginOutputReadLine();
        app.Process.BeginErrorReadLine();

        using var http = new HttpClient { Timeout = TimeSpan.FromSeconds(2) };
        var deadline = DateTime.UtcNow.AddSeconds(60);
        while (DateTime.UtcNow < deadline)
        {
            if (app.Process.HasExited)
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

        string dll = Path.Combine(root?.FullName ?? throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory), "src", "LoopShaper.Web", "bin", configuration, tfm, "LoopShaper.Web.dll");
        return File.Exists(dll) ? dll : throw new FileNotFoundException("Build src/LoopShaper.Web first.", dll);
    }
}
