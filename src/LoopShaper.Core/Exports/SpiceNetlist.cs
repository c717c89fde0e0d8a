using System.Globalization;
using System.Reflection;
using System.Text;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Exports;

/// <summary>
/// SPICE netlists in plain SPICE3 syntax (full-line comments, R, L, C, V, E, G and T elements, `.ac`, `.print`, `.end`),
/// which ngspice runs unmodified (`ngspice -b file.cir`). Part names match the parts list (R1, R2, R3, R4, C1, C2, C3).
/// </summary>
public static class SpiceNetlist
{
    /// <summary>Gain of the voltage-controlled source standing for the ideal amplifier, V/V: the response differs from the ideal one by |1 + Zf/Zin| / A relative.</summary>
    public const double DefaultAmplifierGain = 1e9;

    /// <summary>Characteristic impedance of the matched line that makes a modulator delay, ohms (any value works; the line is matched at both ends).</summary>
    private const double DelayLineOhm = 50.0;

    /// <summary>Resistor of each buffered R-C pole stage of the op-amp macro-model, ohms (any value works; the stage is buffered).</summary>
    private const double PoleStageOhm = 1e3;

    /// <summary>
    /// The op-amp network around an ideal high-gain amplifier, for an AC analysis: Vin drives the network's input
    /// (the converter output side of R1) with 1 V AC, the amplifier is E1 = A (0 - v(inv)), and v(gc) = -v(comp) is
    /// Gc(s) as LoopShaper shows it (the amplifier's inversion taken out). DC and the reference are left out (small signal).
    /// </summary>
    /// <remarks>
    /// When the network's amplifier is an <see cref="OpAmp"/>, the amplifier is its macro-model instead:
    /// A(s) = A0 / ((1 + s/wa)(1 + s/w2)) as a VCVS of gain A0 into an R-C pole at fa = GBW / A0, an optional second
    /// buffered R-C pole at f2, and a unity buffer to the output (Basso 2012, ch. 3, op-amp non-idealities).
    /// </remarks>
    public static string Compensator(OpAmpNetwork network, string designName, SpiceSweep? sweep = null, double amplifierGain = DefaultAmplifierGain)
    {
        var s = Check(sweep, amplifierGain);
        var w = new Writer();
        string amp = network.Amplifier is OpAmp a
            ? string.Create(CultureInfo.InvariantCulture, $"an op-amp macro-model (A0 = {a.OpenLoopGain:G4} V/V, GBW = {Format(a.GainBandwidthHz, "Hz", 4)}{(a.SecondPoleHz is double f2 ? ", second pole " + Format(f2, "Hz", 4) : "")})")
            : $"an ideal amplifier (E source, gain {amplifierGain.ToString("G3", CultureInfo.InvariantCulture)} V/V)";
        w.Comment($"LoopShaper compensator netlist: {Describe(network.Type)} op-amp network around {amp}");
        w.Comment($"design: {Clean(designName)}");
        w.Comment($"written by LoopShaper {Version()}; plain SPICE3, run with: ngspice -b this-file.cir");
        w.Comment("small-signal AC only: the reference and every DC level are left out");
        w.Comment("read: v(gc) = Gc(s) with the amplifier's inversion taken out; v(comp) = -Gc(s) is the amplifier output");
        w.Comment("input: node in is the converter output (the top of the divider)");
        w.Line("Vin in 0 DC 0 AC 1");
        NetworkLines(w, network, "in", amplifierGain);
        w.Comment("Gc as LoopShaper shows it");
        w.Line("Egc gc 0 comp 0 -1");
        Footer(w, s, "vdb(gc) vp(gc)");
        return w.ToString();
    }

    /// <summary>
    /// The averaged small-signal loop of a voltage-mode buck for an AC analysis, with the loop broken at the modulator
    /// input (an ideal high-impedance input, so breaking it loads nothing): a 1 V AC source v(x) drives the modulator
    /// and v(t) = -v(comp) / v(x) is the loop gain T(s) = Gc Fm Gvd with the inversion taken out (shared/CONVENTIONS.md).
    /// Power stage at the operating point of the design's analysis settings (Erickson and Maksimovic, 2nd ed., sec. 7.2):
    /// switch node v(sw) = D vg + Veff d, then D Ron + D' Rlow, the inductor DCR and L, the capacitor branches with their
    /// ESR and ESL, and the load. A modulator delay becomes a matched lossless line.
    /// </summary>
    /// <param name="design">A buck design.</param>
    /// <param name="network">The compensator parts; null takes the design's own op-amp network.</param>
    /// <param name="sweep">The AC sweep.</param>
    /// <param name="amplifierGain">Gain of the amplifier's E source.</param>
    public static string AveragedLoop(LoopDesign design, OpAmpNetwork? network = null, SpiceSweep? sweep = null, double amplifierGain = DefaultAmplifierGain)
    {
        if (design.Plant is not BuckPlant buck)
        {
            throw new ArgumentException("The averaged-loop netlist is written for a buck power stage; a custom plant has no circuit to export.", nameof(design));
        }

        if (buck.Control is not VoltageModeControl control)
        {
            throw new ArgumentException("The averaged-loop netlist is written for a voltage-mode buck; peak current mode has no such circuit here.", nameof(design));
        }

        var n = network ?? design.Compensator as OpAmpNetwork
            ?? throw new ArgumentException("The design's compensator is a placement, not parts: synthesise the parts first and pass the network.", nameof(network));
        var s = Check(sweep, amplifierGain);
        var stage = buck.PowerStage;
        var at = DesignAnalyzer.ConditionOf(stage, design.Analysis);
        var op = BuckOperatingPoint.SolveContinuous(stage, at);
        double vm = control.RampAt(at.InputVoltageV);
        double td = control.TotalDelayS(stage.SwitchingFrequencyHz);
        double d = op.DutyCycle;
        double rsw = (d * stage.HighSideOnResistanceOhm) + ((1 - d) * stage.Rectifier.OnResistanceOhm);
        var inv = CultureInfo.InvariantCulture;

        var w = new Writer();
        w.Comment($"LoopShaper averaged small-signal loop: voltage-mode CCM buck with a {Describe(n.Type)} op-amp compensator, for AC analysis");
        w.Comment($"design: {Clean(design.Name)}");
        w.Comment($"written by LoopShaper {Version()}; plain SPICE3, run with: ngspice -b this-file.cir");
        w.Comment($"operating point: Vin = {Format(at.InputVoltageV, "V", 4)}, Iload = {Format(at.LoadCurrentA, "A", 4)}, D = {d.ToString("F5", inv)}, Veff = {Format(op.EffectiveInputVoltageV, "V", 5)}, Vm = {Format(vm, "V", 4)}");
        w.Comment("read: v(t) = T(s) = Gc Fm Gvd, the loop gain with the amplifier's inversion taken out (loop broken at the modulator input, v(x) = 1)");
        w.Comment("small-signal AC only: every DC level is left out; the line source Vline is 0 for the loop gain");
        w.Comment("injected control voltage at the modulator input (where the loop is broken)");
        w.Line("Vx x 0 DC 0 AC 1");
        string modIn = "x";
        if (td > 0)
        {
            w.Comment($"modulator delay {Format(td, "s", 4)}: line matched at both ends, v(xd) = v(x) exp(-s Td)");
            w.Line("Exd xd1 0 x 0 2");
            w.Line($"Rxd1 xd1 xd2 {N(DelayLineOhm)}");
            w.Line($"Txd xd2 0 xd 0 Z0={N(DelayLineOhm)} TD={N(td)}");
            w.Line($"Rxd2 xd 0 {N(DelayLineOhm)}");
            modIn = "xd";
        }

        w.Comment("modulator Fm = 1 / Vm: v(d) is the duty-cycle perturbation (1 V = 100 %)");
        w.Line($"Emod d 0 {modIn} 0 {N(1.0 / vm)}");
        w.Comment("switch network: v(sw) = D vg + Veff d");
        w.Line("Vline line 0 DC 0 AC 0");
        w.Line($"Eline sw sw1 line 0 {N(d)}");
        w.Line($"Ed sw1 0 d 0 {N(op.EffectiveInputVoltageV)}");
        string node = "sw";
        if (rsw > 0)
        {
            w.Comment("average switch resistance D Ron + D' Rlow");
            w.Line($"Rsw sw nsw {N(rsw)}");
            node = "nsw";
        }

        if (stage.Inductor.DcrOhm > 0)
        {
            w.Comment("inductor DCR");
            w.Line($"Rdcr {node} nl {N(stage.Inductor.DcrOhm)}");
            node = "nl";
        }

        w.Line($"Lout {node} out {N(stage.Inductor.InductanceH)}");
        int k = 0;
        foreach (var b in stage.OutputCapacitors)
        {
            k++;
            w.Comment($"capacitor branch {k}: {Clean(b.Label)}, {b.Count} x {Format(b.CapacitanceF, "F")} (ESR and ESL of the parallel parts)");
            string bn = "out";
            if (b.TotalEsrOhm > 0)
            {
                w.Line($"Resr{k} {bn} cb{k}a {N(b.TotalEsrOhm)}");
                bn = $"cb{k}a";
            }

            if (b.TotalEslH > 0)
            {
                w.Line($"Lesl{k} {bn} cb{k}b {N(b.TotalEslH)}");
                bn = $"cb{k}b";
            }

            w.Line($"Cout{k} {bn} 0 {N(b.TotalCapacitanceF)}");
        }

        if (op.LoadResistanceOhm is double rl)
        {
            w.Comment("load");
            w.Line($"Rload out 0 {N(rl)}");
        }

        NetworkLines(w, n, "out", amplifierGain);
        w.Comment("loop gain: T = -v(comp) / v(x)");
        w.Line("Et t 0 comp 0 -1");
        Footer(w, s, "vdb(t) vp(t)");
        return w.ToString();
    }

    private static SpiceSweep Check(SpiceSweep? sweep, double amplifierGain)
    {
        var s = sweep ?? new SpiceSweep();
        if (s.PointsPerDecade is < 1 or > 1000)
        {
            throw new ArgumentOutOfRangeException(nameof(sweep), s.PointsPerDecade, "The sweep needs 1 to 1000 points per decade.");
        }

        if (!(s.StartHz > 0) || !(s.StopHz > s.StartHz) || !double.IsFinite(s.StopHz))
        {
            throw new ArgumentOutOfRangeException(nameof(sweep), "The sweep needs 0 < start < stop, both finite.");
        }

        if (!(amplifierGain >= 1e3) || !double.IsFinite(amplifierGain))
        {
            throw new ArgumentOutOfRangeException(nameof(amplifierGain), amplifierGain, "The amplifier gain must be finite and at least 1e3 V/V.");
        }

        return s;
    }

    private static void NetworkLines(Writer w, OpAmpNetwork n, string input, double gain)
    {
        w.Comment($"{Describe(n.Type)} network: R1 from {input} to the inverting input inv; the amplifier output is comp");
        w.Line($"R1 {input} inv {N(n.R1Ohm)}");
        if (n.Type == CompensatorType.TypeI)
        {
            w.Line($"C1 inv comp {N(n.C1F)}");
        }
        else
        {
            w.Line($"R2 inv n2 {N(n.R2Ohm)}");
            w.Line($"C1 n2 comp {N(n.C1F)}");
            w.Line($"C2 inv comp {N(n.C2F)}");
        }

        if (n.Type == CompensatorType.TypeIII)
        {
            w.Line($"R3 {input} n3 {N(n.R3Ohm)}");
            w.Line($"C3 n3 inv {N(n.C3F)}");
        }

        if (n.RBottomOhm > 0)
        {
            w.Comment("divider bottom: sets the DC output only (no AC effect with an ideal amplifier)");
            w.Line($"R4 inv 0 {N(n.RBottomOhm)}");
        }

        if (n.Amplifier is OpAmp a)
        {
            OpAmpLines(w, a);
            return;
        }

        w.Comment("ideal amplifier: non-inverting input at AC ground, v(comp) = A (0 - v(inv))");
        w.Line($"Eamp comp 0 0 inv {N(gain)}");
    }

    /// <summary>Op-amp macro-model: v(pa) = A0 (0 - v(inv)), R-C pole at fa, optional buffered R-C pole at f2, unity buffer to comp.</summary>
    private static void OpAmpLines(Writer w, OpAmp a)
    {
        w.Comment($"op-amp macro-model: gain stage A0 = {N(a.OpenLoopGain)} V/V, non-inverting input at AC ground");
        w.Line($"Eamp pa 0 0 inv {N(a.OpenLoopGain)}");
        w.Comment($"dominant pole fa = GBW / A0 = {Format(a.DominantPoleHz, "Hz", 4)}: Rpa Cpa = 1 / (2 pi fa)");
        w.Line($"Rpa pa pb {N(PoleStageOhm)}");
        w.Line($"Cpa pb 0 {N(1.0 / (2 * Math.PI * a.DominantPoleHz * PoleStageOhm))}");
        string last = "pb";
        if (a.SecondPoleHz is double f2)
        {
            w.Comment($"second pole f2 = {Format(f2, "Hz", 4)}, buffered from the first");
            w.Line("Ebuf2 pc 0 pb 0 1");
            w.Line($"Rpb pc pd {N(PoleStageOhm)}");
            w.Line($"Cpb pd 0 {N(1.0 / (2 * Math.PI * f2 * PoleStageOhm))}");
            last = "pd";
        }

        w.Comment("output buffer: the pole stages are not loaded by the network");
        w.Line($"Eout comp 0 {last} 0 1");
    }

    /// <summary>
    /// The transconductance (OTA) compensator for an AC analysis: Vin drives the divider Rtop over Rbot (the plant's
    /// feedback divider, Hdiv = Rbot / (Rtop + Rbot)), the amplifier is a VCCS of gm, current gm (0 - v(fb)) into comp,
    /// loaded by Ro in parallel with the network to ground (C1, or R2 + C1 in parallel with C2). v(gc) = -v(comp) / Hdiv
    /// is Gc(s) as LoopShaper shows it (from the divided output, the inversion taken out); v(gcout) = -v(comp) is
    /// Hdiv Gc(s), from the converter output (Basso 2012, ch. 3, OTA compensators).
    /// </summary>
    public static string Compensator(TransconductanceNetwork network, FeedbackDivider divider, string designName, SpiceSweep? sweep = null)
    {
        var s = Check(sweep, DefaultAmplifierGain);
        if (!(divider.TopOhm > 0) || !(divider.BottomOhm > 0) || !double.IsFinite(divider.TopOhm) || !double.IsFinite(divider.BottomOhm))
        {
            throw new ArgumentOutOfRangeException(nameof(divider), "The divider needs finite positive top and bottom resistors.");
        }

        _ = network.ToPlacement();
        var a = network.Amplifier;
        var w = new Writer();
        w.Comment(string.Create(CultureInfo.InvariantCulture, $"LoopShaper compensator netlist: {Describe(network.Type)} transconductance (OTA) network, gm = {Format(a.TransconductanceS, "S", 4)}, Ro = {Format(a.OutputResistanceOhm, "Ohm", 4)}"));
        w.Comment($"design: {Clean(designName)}");
        w.Comment($"written by LoopShaper {Version()}; plain SPICE3, run with: ngspice -b this-file.cir");
        w.Comment("small-signal AC only: the reference and every DC level are left out");
        w.Comment("read: v(gc) = Gc(s) from the divided output fb, the inversion taken out; v(gcout) = Hdiv Gc(s) from the converter output");
        w.Comment("input: node in is the converter output (the top of the divider)");
        w.Line("Vin in 0 DC 0 AC 1");
        w.Comment("feedback divider ahead of the amplifier");
        w.Line($"Rtop in fb {N(divider.TopOhm)}");
        w.Line($"Rbot fb 0 {N(divider.BottomOhm)}");
        w.Comment("OTA: current gm (0 - v(fb)) into comp (reference at AC ground), output resistance Ro");
        w.Line($"Gota comp 0 fb 0 {N(a.TransconductanceS)}");
        w.Line($"Ro comp 0 {N(a.OutputResistanceOhm)}");
        w.Comment($"{Describe(network.Type)} network from comp to ground");
        if (network.Type == CompensatorType.TypeI)
        {
            w.Line($"C1 comp 0 {N(network.C1F)}");
        }
        else
        {
            w.Line($"R2 comp n2 {N(network.R2Ohm)}");
            w.Line($"C1 n2 0 {N(network.C1F)}");
            w.Line($"C2 comp 0 {N(network.C2F)}");
        }

        w.Comment("Gc as LoopShaper shows it, and from the converter output");
        w.Line($"Egc gc 0 comp 0 {N(-1.0 / divider.Ratio)}");
        w.Line("Egcout gcout 0 comp 0 -1");
        Footer(w, s, "vdb(gc) vp(gc) vdb(gcout) vp(gcout)");
        return w.ToString();
    }

    private static void Footer(Writer w, SpiceSweep s, string print)
    {
        var inv = CultureInfo.InvariantCulture;
        w.Line($".ac dec {s.PointsPerDecade.ToString(inv)} {N(s.StartHz)} {N(s.StopHz)}");
        w.Line($".print ac {print}");
        w.Line(".end");
    }

    private static string Describe(CompensatorType t) => t switch
    {
        CompensatorType.TypeI => "Type I",
        CompensatorType.TypeII => "Type II",
        _ => "Type III",
    };

    /// <summary>A number as SPICE reads it: culture-invariant, round-trip, no SI suffix (SPICE's M is milli).</summary>
    private static string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    private static string Clean(string s) => s.Replace('\r', ' ').Replace('\n', ' ');

    private static string Version() => typeof(SpiceNetlist).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0] ?? "0";

    private sealed class Writer
    {
        private readonly StringBuilder _sb = new();

        public void Comment(string text) => _sb.Append("* ").Append(text).Append('\n');

        public void Line(string text) => _sb.Append(text).Append('\n');

        public override string ToString() => _sb.ToString();
    }
}
