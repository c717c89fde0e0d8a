using System.Numerics;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>
/// The exported netlists, run unmodified by ngspice (Debian package ngspice, live; the test fails when it is missing),
/// against the core's responses.
/// </summary>
public class NgspiceExportTests
{
    // Tolerances of the issue: 0.01 dB and 0.05 deg. The netlists' 1e9 V/V amplifier explains a relative
    // |1 + Zf/Zin| / 1e9, below 1e-4 dB for the |Gc| of at most a few thousand at 10 Hz of the networks below.
    private const double MagnitudeToleranceDb = 0.01;
    private const double PhaseToleranceDeg = 0.05;

    /// <summary>Snapped networks synthesised for the test buck: K-factor placements at 60 kHz.</summary>
    internal static OpAmpNetwork Network(CompensatorType type)
    {
        var plant = TestPlants.BuckPlant();
        var (fc, pm) = type switch
        {
            CompensatorType.TypeI => (2e3, 30.0),
            CompensatorType.TypeII => (60e3, 35.0),
            _ => (60e3, 45.0),
        };
        var s = PlacementAdvisor.Suggest(plant, new PlacementRequest(PlacementMethod.KFactor, fc, pm, type, 600e3));
        var r = NetworkSynthesizer.Synthesize(plant, s.Placement, new SynthesisOptions { OutputVoltageV = 1.2, ReferenceV = 0.6 });
        Assert.Equal(type, r.SnappedNetwork.Type);
        return r.SnappedNetwork;
    }

    [Theory]
    [InlineData(CompensatorType.TypeI)]
    [InlineData(CompensatorType.TypeII)]
    [InlineData(CompensatorType.TypeIII)]
    public void Compensator_netlist_gives_the_core_response_from_10_Hz_to_10_MHz(CompensatorType type)
    {
        var n = Network(type);
        string netlist = SpiceNetlist.Compensator(n, "1V2 rail");
        Assert.StartsWith("* LoopShaper compensator netlist", netlist, StringComparison.Ordinal);
        Assert.Contains("* design: 1V2 rail", netlist, StringComparison.Ordinal);
        var points = Ngspice.RunAc(netlist, "v(gc)");

        // 40 points per decade from 10 Hz to 10 MHz: 241 points.
        Assert.Equal(241, points.Count);
        Assert.Equal(10.0, points[0].FrequencyHz, 1e-6);
        Assert.Equal(10e6, points[^1].FrequencyHz, 1e-3);
        Compare(n.TransferFunction(), points, type.ToString());
    }

    public static TheoryData<string> Loops => ["synchronous, no delay", "diode, 150 ns modulator delay, feedforward"];

    [Theory]
    [MemberData(nameof(Loops))]
    public void Averaged_loop_netlist_gives_the_core_loop_gain(string name)
    {
        // Loop gain of the core (DesignAnalyzer.BuildLoop: Gc Fm Gvd, Erickson & Maksimovic sec. 8.2 with the losses of
        // sec. 7.2) against ngspice's AC analysis of the averaged circuit, at every point of the 40-per-decade sweep
        // from 10 Hz to 10 MHz (241 frequencies, more than the 20 asked for), same tolerances as the compensator:
        // both sides solve the same linear circuit, and only the amplifier's finite gain separates them.
        var n = Network(CompensatorType.TypeIII);
        var design = TestPlants.Buck(n);
        if (name.StartsWith("diode", StringComparison.Ordinal))
        {
            design = TestPlants.Buck(n, TestPlants.Stage() with { Rectifier = Rectifier.Diode(0.4, 20e-3) }, new VoltageModeControl(0, true, 0.1, 150e-9));
        }

        string netlist = SpiceNetlist.AveragedLoop(design);
        Assert.StartsWith("* LoopShaper averaged small-signal loop", netlist, StringComparison.Ordinal);
        var points = Ngspice.RunAc(netlist, "v(t)");
        Assert.Equal(241, points.Count);
        var t = DesignAnalyzer.BuildLoop(design).Loop.LoopGain;
        Compare(t, points, name);
    }

    [Fact]
    public void Averaged_loop_needs_parts_and_a_buck()
    {
        var placement = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 1e3), Zero1Hz: 1e3, Pole1Hz: 1e5);
        var ex = Assert.Throws<ArgumentException>(() => SpiceNetlist.AveragedLoop(TestPlants.Buck(placement)));
        Assert.Contains("synthesise the parts first", ex.Message, StringComparison.Ordinal);
        Assert.Contains("Vx x 0 DC 0 AC 1", SpiceNetlist.AveragedLoop(TestPlants.Buck(placement), Network(CompensatorType.TypeII)), StringComparison.Ordinal);
    }

    [Fact]
    public void Netlists_are_plain_SPICE3_with_a_header_and_the_parts_list_names()
    {
        var n = Network(CompensatorType.TypeIII);
        foreach (string netlist in new[] { SpiceNetlist.Compensator(n, "rail\nwith a line break"), SpiceNetlist.AveragedLoop(TestPlants.Buck(n)) })
        {
            var lines = netlist.Split('\n', StringSplitOptions.RemoveEmptyEntries);
            Assert.StartsWith("* LoopShaper", lines[0], StringComparison.Ordinal);
            Assert.Equal(".end", lines[^1]);
            // No ngspice-only control block, no inline comments: every line is a comment, an element or a dot card.
            Assert.DoesNotContain(".control", netlist, StringComparison.Ordinal);
            Assert.All(lines, l => Assert.True(l.StartsWith('*') || l.StartsWith('.') || !l.Contains(';', StringComparison.Ordinal), l));
            foreach (string d in new[] { "R1 ", "R2 ", "R3 ", "R4 ", "C1 ", "C2 ", "C3 " })
            {
                Assert.Contains(lines, l => l.StartsWith(d, StringComparison.Ordinal));
            }
        }

        Assert.Contains("* design: rail with a line break", SpiceNetlist.Compensator(n, "rail\nwith a line break"), StringComparison.Ordinal);
        Assert.Throws<ArgumentOutOfRangeException>(() => SpiceNetlist.Compensator(n, "x", new SpiceSweep(0)));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpiceNetlist.Compensator(n, "x", new SpiceSweep(10, 1e3, 10)));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpiceNetlist.Compensator(n, "x", null, double.NaN));
    }

    internal static void Compare(Core.TransferFunctions.TransferFunction h, List<(double FrequencyHz, Complex Value)> points, string name)
    {
        // The reference phase is the principal value at 10 Hz, then unwrapped point by point; ours is continuous by
        // construction, so the two must agree without any offset.
        double? previous = null;
        foreach (var (f, v) in points)
        {
            double refDb = 20 * Math.Log10(v.Magnitude);
            double refDeg = v.Phase * 180 / Math.PI;
            if (previous is double p)
            {
                refDeg -= 360 * Math.Round((refDeg - p) / 360);
            }

            previous = refDeg;
            Assert.True(Math.Abs(h.MagnitudeDb(f) - refDb) <= MagnitudeToleranceDb, $"{name} at {f:G6} Hz: ours {h.MagnitudeDb(f):F5} dB, ngspice {refDb:F5} dB");
            Assert.True(Math.Abs(h.PhaseDeg(f) - refDeg) <= PhaseToleranceDeg, $"{name} at {f:G6} Hz: ours {h.PhaseDeg(f):F4} deg, ngspice {refDeg:F4} deg");
        }
    }
}
