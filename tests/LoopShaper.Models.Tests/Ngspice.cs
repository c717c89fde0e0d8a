using System.ComponentModel;
using System.Diagnostics;
using System.Globalization;
using System.Numerics;

namespace LoopShaper.Models.Tests;

/// <summary>Runs an ngspice AC analysis (ngspice -b) of a netlist and reads one node voltage back.</summary>
internal static class Ngspice
{
    /// <summary>AC analysis from 10 Hz to 10 MHz, 40 points per decade; returns frequency and the complex node voltage.</summary>
    public static List<(double FrequencyHz, Complex V)> AcAnalysis(IEnumerable<string> circuit, string node)
    {
        var dir = Directory.CreateTempSubdirectory("loopshaper-ngspice-");
        try
        {
            string output = Path.Combine(dir.FullName, "v.txt");
            string netlist = Path.Combine(dir.FullName, "circuit.cir");
            var lines = circuit.ToList();
            lines.AddRange([".control", "set wr_singlescale", "set wr_vecnames", "option numdgt=15", "ac dec 40 10 10meg", $"wrdata {output} v({node})", "quit", ".endc", ".end"]);
            File.WriteAllText(netlist, string.Join('\n', lines) + "\n");

            var start = new ProcessStartInfo("ngspice")
            {
                WorkingDirectory = dir.FullName,
                RedirectStandardOutput = true,
                RedirectStandardError = true,
                UseShellExecute = false,
            };
            start.ArgumentList.Add("-b");
            start.ArgumentList.Add(netlist);
            Process process;
            try
            {
                process = Process.Start(start) ?? throw new InvalidOperationException("Process.Start returned null");
            }
            catch (Win32Exception ex)
            {
                Assert.Fail($"ngspice is not on PATH ({ex.Message}). These tests need the Debian package 'ngspice' (apt-get install ngspice); the project's test command installs it.");
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
                Assert.True(File.Exists(output), $"ngspice wrote no output file:\n{stdout.Result}\n{stderr.Result}");
            }

            // wrdata with wr_singlescale and wr_vecnames: a header line, then "frequency re(v) im(v)" per point.
            var inv = CultureInfo.InvariantCulture;
            var result = new List<(double, Complex)>();
            foreach (var line in File.ReadAllLines(output).Skip(1))
            {
                var cols = line.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
                if (cols.Length == 0)
                {
                    continue;
                }

                Assert.True(cols.Length == 3, $"unexpected ngspice output line: '{line}'");
                result.Add((double.Parse(cols[0], inv), new Complex(double.Parse(cols[1], inv), double.Parse(cols[2], inv))));
            }

            return result;
        }
        finally
        {
            dir.Delete(recursive: true);
        }
    }
}
