using System.Globalization;
using System.Numerics;
using LoopShaper.Tests.Shared;

namespace LoopShaper.Synthesis.Tests;

/// <summary>
/// Runs a netlist through ngspice (Debian package ngspice) live, unmodified: `ngspice -b -r out.raw file.cir` with an
/// ASCII raw file (SPICE_ASCIIRAWFILE=1), and reads one complex vector of the AC analysis from it.
/// </summary>
internal static class Ngspice
{
    public static List<(double FrequencyHz, Complex Value)> RunAc(string netlist, string vector)
    {
        var dir = Directory.CreateTempSubdirectory("loopshaper-synth-ngspice-");
        try
        {
            string raw = Path.Combine(dir.FullName, "out.raw");
            string file = Path.Combine(dir.FullName, "netlist.cir");
            File.WriteAllText(file, netlist);
            var (stdout, stderr) = NgspiceProcess.Run(dir.FullName, ["-b", "-r", raw, file], new Dictionary<string, string> { ["SPICE_ASCIIRAWFILE"] = "1" });
            Assert.True(File.Exists(raw), $"ngspice wrote no raw file:\n{stdout}\n{stderr}");
            Assert.DoesNotContain("error", stdout + stderr, StringComparison.OrdinalIgnoreCase);

            return ParseRaw(File.ReadAllLines(raw), vector);
        }
        finally
        {
            dir.Delete(recursive: true);
        }
    }

    /// <summary>
    /// ASCII raw file: a "Variables:" list (index, name, type), then "Values:" with, per point, "index  freq_re,freq_im"
    /// followed by one "re,im" line per other variable.
    /// </summary>
    private static List<(double, Complex)> ParseRaw(string[] lines, string vector)
    {
        var inv = CultureInfo.InvariantCulture;
        int nVars = int.Parse(lines.First(l => l.StartsWith("No. Variables:", StringComparison.Ordinal))["No. Variables:".Length..].Trim(), inv);
        int nPoints = int.Parse(lines.First(l => l.StartsWith("No. Points:", StringComparison.Ordinal))["No. Points:".Length..].Trim(), inv);
        int varsAt = Array.FindIndex(lines, l => l.StartsWith("Variables:", StringComparison.Ordinal));
        int column = -1;
        for (int i = 0; i < nVars; i++)
        {
            var cols = lines[varsAt + 1 + i].Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
            if (cols[1] == vector)
            {
                column = i;
            }
        }

        Assert.True(column > 0, $"ngspice's raw file has no vector {vector}");
        int valuesAt = Array.FindIndex(lines, l => l.StartsWith("Values:", StringComparison.Ordinal)) + 1;
        var result = new List<(double, Complex)>(nPoints);
        for (int p = 0; p < nPoints; p++)
        {
            int first = valuesAt + (p * nVars);
            var f = Pair(lines[first].Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries)[1]);
            var v = Pair(lines[first + column].Trim());
            result.Add((f.Real, v));
        }

        return result;

        Complex Pair(string s)
        {
            var parts = s.Split(',');
            return new Complex(double.Parse(parts[0], inv), double.Parse(parts[1], inv));
        }
    }
}
