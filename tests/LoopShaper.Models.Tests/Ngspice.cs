using System.Globalization;
using System.Numerics;
using LoopShaper.Tests.Shared;

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

            var (stdout, stderr) = NgspiceProcess.Run(dir.FullName, ["-b", netlist]);
            Assert.True(File.Exists(output), $"ngspice wrote no output file:\n{stdout}\n{stderr}");

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
