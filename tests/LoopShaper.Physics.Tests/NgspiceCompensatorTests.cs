using System.Globalization;
using System.Numerics;
using LoopShaper.Core.Compensators;
using LoopShaper.Tests.Shared;

namespace LoopShaper.Physics.Tests;

/// <summary>
/// The op-amp Type I/II/III networks built from parts (OpAmpNetwork) against an AC analysis of the same circuit by
/// ngspice (Debian package ngspice), run live: the test writes the netlist, runs `ngspice -b` and reads its output.
/// </summary>
public class NgspiceCompensatorTests
{
    // A 1e9 V/V amplifier: the ideal-amplifier formula differs from it by a relative |1 + Zf/Zin| / 1e9, below 1e-5 dB
    // for the |Gc| of at most a few hundred (at 10 Hz) of the networks below.
    private const double AmplifierGain = 1e9;

    // Tolerances of the brief: 0.01 dB and 0.05 deg.
    private const double MagnitudeToleranceDb = 0.01;
    private const double PhaseToleranceDeg = 0.05;

    /// <summary>Part values of our own, for a 12 V to 3.3 V, 500 kHz converter.</summary>
    private static OpAmpNetwork Network(string name) => name switch
    {
        // fi = 1.59 kHz.
        "TypeI" => new OpAmpNetwork(CompensatorType.TypeI, R1Ohm: 10e3, C1F: 10e-9),

        // fi = 1.03 kHz, fz = 1.06 kHz, fp = 35 kHz.
        "TypeII" => new OpAmpNetwork(CompensatorType.TypeII, R1Ohm: 49.9e3, C1F: 1.5e-9, R2Ohm: 100e3, C2F: 47e-12),

        // fi = 3.3 kHz, fz1 = 1.69 kHz, fz2 = 7.0 kHz, fp1 = 81 kHz, fp2 = 219 kHz.
        "TypeIII" => new OpAmpNetwork(CompensatorType.TypeIII, R1Ohm: 10e3, C1F: 4.7e-9, R2Ohm: 20e3, C2F: 100e-12, R3Ohm: 330, C3F: 2.2e-9),
        _ => throw new ArgumentException("unknown network " + name, nameof(name)),
    };

    /// <summary>
    /// The circuit as drawn: R1 (and R3 + C3 for Type III) from the input node to the inverting node, C1 (in series with
    /// R2, and C2 across both, for Type II and III) from the inverting node to the output; the amplifier is a voltage-
    /// controlled source out = A (0 - v(inv)) with its non-inverting input at ground.
    /// </summary>
    private static string Netlist(OpAmpNetwork n, string outputFile)
    {
        var inv = CultureInfo.InvariantCulture;
        var lines = new List<string>
        {
            $"* LoopShaper physics test: {n.Type} op-amp network",
            "Vin in 0 DC 0 AC 1",
            string.Create(inv, $"R1 in inv {n.R1Ohm:R}"),
        };
        if (n.Type == CompensatorType.TypeI)
        {
            lines.Add(string.Create(inv, $"C1 inv out {n.C1F:R}"));
        }
        else
        {
            lines.Add(string.Create(inv, $"R2 inv n2 {n.R2Ohm:R}"));
            lines.Add(string.Create(inv, $"C1 n2 out {n.C1F:R}"));
            lines.Add(string.Create(inv, $"C2 inv out {n.C2F:R}"));
        }

        if (n.Type == CompensatorType.TypeIII)
        {
            lines.Add(string.Create(inv, $"R3 in n3 {n.R3Ohm:R}"));
            lines.Add(string.Create(inv, $"C3 n3 inv {n.C3F:R}"));
        }

        lines.Add(string.Create(inv, $"E1 out 0 0 inv {AmplifierGain:R}"));
        lines.AddRange(
        [
            ".control",
            "set wr_singlescale",
            "set wr_vecnames",
            "option numdgt=15",
            "ac dec 40 10 10meg",
            $"wrdata {outputFile} v(out)",
            "quit",
            ".endc",
            ".end",
        ]);
        return string.Join('\n', lines) + "\n";
    }

    [Theory]
    [InlineData("TypeI")]
    [InlineData("TypeII")]
    [InlineData("TypeIII")]
    public void Network_from_parts_matches_ngspice_ac_analysis(string name)
    {
        var network = Network(name);
        var gc = network.TransferFunction();
        var points = RunNgspice(network);

        // 40 points per decade from 10 Hz to 10 MHz.
        Assert.True(points.Count >= 6 * 20, $"ngspice returned {points.Count} points, expected at least 120");
        Assert.Equal(10.0, points[0].FrequencyHz, 1e-6);
        Assert.Equal(10e6, points[^1].FrequencyHz, 1e-3);

        // Our Gc has the amplifier's inversion taken out (shared/CONVENTIONS.md): compare with -vout/vin. The reference
        // phase is the principal value at the first point, then unwrapped point by point; ours is continuous by
        // construction and starts at -90 deg for the integrator, so the two must agree without any offset.
        double? previous = null;
        double worstDb = 0, worstDeg = 0;
        foreach (var (f, vout) in points)
        {
            var reference = -vout;
            double refDb = 20 * Math.Log10(reference.Magnitude);
            double refDeg = reference.Phase * 180 / Math.PI;
            if (previous is double p)
            {
                refDeg -= 360 * Math.Round((refDeg - p) / 360);
            }

            previous = refDeg;
            double dDb = gc.MagnitudeDb(f) - refDb;
            double dDeg = gc.PhaseDeg(f) - refDeg;
            worstDb = Math.Max(worstDb, Math.Abs(dDb));
            worstDeg = Math.Max(worstDeg, Math.Abs(dDeg));
            Assert.True(Math.Abs(dDb) <= MagnitudeToleranceDb, $"{name} at {f:G6} Hz: ours {gc.MagnitudeDb(f):F5} dB, ngspice {refDb:F5} dB");
            Assert.True(Math.Abs(dDeg) <= PhaseToleranceDeg, $"{name} at {f:G6} Hz: ours {gc.PhaseDeg(f):F4} deg, ngspice {refDeg:F4} deg");
        }

        // The comparison spans the shape: the integrator at the low end, the high-frequency poles at the top.
        Assert.Equal(-90.0, gc.PhaseDeg(points[0].FrequencyHz), 5.0);
        Assert.True(worstDb < 1e-3 && worstDeg < 5e-3, $"{name}: worst differences {worstDb:G3} dB and {worstDeg:G3} deg, more than the 1e-5 dB the amplifier's finite gain explains");
    }

    private static List<(double FrequencyHz, Complex Vout)> RunNgspice(OpAmpNetwork network)
    {
        var dir = Directory.CreateTempSubdirectory("loopshaper-ngspice-");
        try
        {
            string output = Path.Combine(dir.FullName, "vout.txt");
            string netlist = Path.Combine(dir.FullName, "network.cir");
            File.WriteAllText(netlist, Netlist(network, output));

            var (stdout, stderr) = NgspiceProcess.Run(dir.FullName, ["-b", netlist]);
            Assert.True(File.Exists(output), $"ngspice wrote no output file:\n{stdout}\n{stderr}");

            return Parse(File.ReadAllLines(output));
        }
        finally
        {
            dir.Delete(recursive: true);
        }
    }

    /// <summary>wrdata with wr_singlescale and wr_vecnames: a header line, then "frequency re(v) im(v)" per point.</summary>
    private static List<(double FrequencyHz, Complex Vout)> Parse(string[] lines)
    {
        var inv = CultureInfo.InvariantCulture;
        var result = new List<(double, Complex)>();
        foreach (var line in lines.Skip(1))
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
}
