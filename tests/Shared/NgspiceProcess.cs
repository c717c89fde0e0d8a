using System.ComponentModel;
using System.Diagnostics;

namespace LoopShaper.Tests.Shared;

/// <summary>
/// Starts Debian's ngspice in batch mode in a working folder and fails the test, never skips it, when ngspice is
/// missing, times out or reports an error. Linked into every test project that checks against ngspice.
/// </summary>
internal static class NgspiceProcess
{
    /// <summary>Runs `ngspice ARGS` in <paramref name="workingDirectory"/>; returns standard output and error.</summary>
    public static (string Stdout, string Stderr) Run(string workingDirectory, IEnumerable<string> arguments, IReadOnlyDictionary<string, string>? environment = null)
    {
        var start = new ProcessStartInfo("ngspice")
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var (key, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[key] = value;
        }

        foreach (var a in arguments)
        {
            start.ArgumentList.Add(a);
        }

        Process process;
        try
        {
            process = Process.Start(start) ?? throw new InvalidOperationException("Process.Start returned null");
        }
        catch (Win32Exception ex)
        {
            Assert.Fail($"ngspice is not on PATH ({ex.Message}). This test needs the Debian package 'ngspice' (apt-get install ngspice); the project's test command installs it.");
            throw;
        }

        using (process)
        {
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(TimeSpan.FromSeconds(120)))
            {
                process.Kill(entireProcessTree: true);
                Assert.Fail("ngspice did not finish within 120 s.");
            }

            Assert.True(process.ExitCode == 0, $"ngspice exited with {process.ExitCode}:\n{stdout.Result}\n{stderr.Result}");
            return (stdout.Result, stderr.Result);
        }
    }
}
