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
    /// The small-signal loop the analysis uses, for an AC analysis with v(t) = T(s): the averaged circuit of the
    /// voltage-mode CCM buck (<see cref="AveragedLoop"/>) where that is the analysed model, otherwise
    /// <see cref="StateSpaceLoop"/> (peak current mode, an operating point analysed with the DCM model, a custom plant).
    /// </summary>
    /// <param name="design">The design.</param>
    /// <param name="network">The compensator parts (op-amp or OTA network); null takes the design's own.</param>
    /// <param name="sweep">The AC sweep.</param>
    /// <param name="amplifierGain">Gain of an ideal amplifier's E source.</param>
    public static string Loop(LoopDesign design, Compensator? network = null, SpiceSweep? sweep = null, double amplifierGain = DefaultAmplifierGain)
        => AveragedLoopSupport.UsesAveragedCircuit(design)
            ? AveragedLoop(design, network, sweep, amplifierGain)
            : StateSpaceLoop(design, network, sweep, amplifierGain);

    /// <summary>
    /// The averaged small-signal loop of a voltage-mode buck for an AC analysis, with the loop broken at the modulator
    /// input (an ideal high-impedance input, so breaking it loads nothing): a 1 V AC source v(x) drives the modulator
    /// and v(t) = -v(comp) / v(x) is the loop gain T(s) = Gc Fm Gvd with the inversion taken out (shared/CONVENTIONS.md).
    /// Power stage at the operating point of the design's analysis settings (Erickson and Maksimovic, 2nd ed., sec. 7.2):
    /// switch node v(sw) = D vg + Veff d, then D Ron + D' Rlow, the inductor DCR and L, the capacitor branches with their
    /// ESR and ESL, and the load. A modulator delay becomes a matched lossless line.
    /// </summary>
    /// <param name="design">A buck design.</param>
    /// <param name="network">The compensator parts (op-amp or OTA network); null takes the design's own.</param>
    /// <param name="sweep">The AC sweep.</param>
    /// <param name="amplifierGain">Gain of the amplifier's E source.</param>
    public static string AveragedLoop(LoopDesign design, Compensator? network = null, SpiceSweep? sweep = null, double amplifierGain = DefaultAmplifierGain)
    {
        if (design.Plant is not BuckPlant buck)
        {
            throw new ArgumentException("The averaged-loop circuit is written for a buck power stage; a custom plant has no circuit (use the state-space loop netlist).", nameof(design));
        }

        if (buck.Control is not VoltageModeControl control)
        {
            throw new ArgumentException("The averaged-loop circuit is written for a voltage-mode buck; peak current mode has no such circuit here (use the state-space loop netlist).", nameof(design));
        }

        var n = Parts(design, network);
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
        w.Comment($"LoopShaper averaged small-signal loop: voltage-mode CCM buck with a {DescribeCompensator(n)}, for AC analysis");
        w.Comment($"design: {Clean(design.Name)}");
        w.Comment($"written by LoopShaper {Version()}; plain SPICE3, run with: ngspice -b this-file.cir");
        w.Comment("model: the averaged CCM circuit of the power stage (Erickson and Maksimovic, 2nd ed., sec. 7.2)");
        w.Comment($"operating point: Vin = {Format(at.InputVoltageV, "V", 4)}, Iload = {Format(at.LoadCurrentA, "A", 4)}, D = {d.ToString("F5", inv)}, Veff = {Format(op.EffectiveInputVoltageV, "V", 5)}, Vm = {Format(vm, "V", 4)}");
        w.Comment("read: v(t) = T(s) = Gc Fm Gvd, the loop gain with the amplifier's inversion taken out (loop broken at the modulator input, v(x) = 1)");
        w.Comment("small-signal AC only: every DC level is left out; the line source Vline is 0 for the loop gain");
        w.Comment("injected control voltage at the modulator input (where the loop is broken)");
        w.Line("Vx x 0 DC 0 AC 1");
        string modIn = DelayLines(w, "x", td);
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

        LoopCompensatorLines(w, n, buck.Feedback, buck.Feedback.Ratio, amplifierGain);
        w.Comment("loop gain: T = -v(comp) / v(x)");
        w.Line("Et t 0 comp 0 -1");
        Footer(w, s, "vdb(t) vp(t)");
        return w.ToString();
    }

    /// <summary>
    /// The loop for an AC analysis with the plant the analysis uses realised as a circuit of its transfer function, not
    /// of the power stage: Fm Gvd from DesignAnalyzer.BuildLoop (peak current mode with Ridley's sampling terms, the DCM
    /// model, or a custom plant) as a cascade of frequency-scaled state-space sections (<see cref="StateSpaceRealization"/>).
    /// Each state is a node with a 1 F capacitor to ground, integrating the currents of VCCS of w0 times the section's
    /// coefficients (C dv/dt = w0 (...)), and a 1e12 Ohm leak that gives the operating point a DC path (it moves each
    /// pole by 1e-12 rad/s); each section's output is the sum of weighted state currents into 1 Ohm. A pure delay is a
    /// matched lossless line (exact in AC analysis). The compensator parts follow around the chosen amplifier model, and
    /// v(t) = -v(comp) / v(x) is T(s) with the inversion taken out.
    /// </summary>
    /// <param name="design">The design (any plant).</param>
    /// <param name="network">The compensator parts (op-amp or OTA network); null takes the design's own.</param>
    /// <param name="sweep">The AC sweep.</param>
    /// <param name="amplifierGain">Gain of an ideal amplifier's E source.</param>
    public static string StateSpaceLoop(LoopDesign design, Compensator? network = null, SpiceSweep? sweep = null, double amplifierGain = DefaultAmplifierGain)
    {
        var n = Parts(design, network);
        var s = Check(sweep, amplifierGain);
        var built = DesignAnalyzer.BuildLoop(design with { Compensator = n });
        var plant = built.Loop.Modulator.Multiply(built.Loop.ControlToOutput);
        var (sections, gain) = StateSpaceRealization.Realize(plant);
        var inv = CultureInfo.InvariantCulture;

        var w = new Writer();
        w.Comment($"LoopShaper loop netlist: state-space realisation of the {DescribeModel(built.Model)} plant with a {DescribeCompensator(n)}, for AC analysis");
        w.Comment($"design: {Clean(design.Name)}");
        w.Comment($"written by LoopShaper {Version()}; plain SPICE3, run with: ngspice -b this-file.cir");
        w.Comment($"model: {ModelSource(built.Model)}");
        if (built.OperatingPoint is { } op)
        {
            w.Comment($"operating point: Vin = {Format(op.Condition.InputVoltageV, "V", 4)}, Iload = {Format(op.Condition.LoadCurrentA, "A", 4)}, D = {op.DutyCycle.ToString("F5", inv)}");
        }

        w.Comment("this is a circuit of the analysed transfer function, not of the power stage: nodes x1.. are states, not circuit voltages");
        w.Comment($"plant Fm Gvd = {Clean(plant.WithoutDelay().ToString())}");
        w.Comment(plant.HasDelay ? $"delay {Format(plant.DelayS, "s", 4)}: a matched lossless line, exact in AC analysis" : "no pure delay in the model");
        w.Comment("read: v(t) = T(s) = Gc Fm Gvd H, the loop gain with the amplifier's inversion taken out (loop broken at the plant input, v(x) = 1)");
        w.Comment("small-signal AC only: every DC level is left out");
        w.Comment("injected control voltage at the plant input (where the loop is broken)");
        w.Line("Vx x 0 DC 0 AC 1");
        string u = DelayLines(w, "x", plant.DelayS);
        int state = 0;
        for (int k = 0; k < sections.Length; k++)
        {
            var sec = sections[k];
            double w0 = sec.ScaleRadPerS;
            w.Comment(string.Create(inv, $"section {k + 1}: order {sec.Order}, w0 = {w0:G6} rad/s, H(s') = ({Polynomial(sec.NumeratorAscending)}) / ({Polynomial([.. sec.DenominatorAscending, 1.0])}), s' = s / w0"));
            var x = new string[sec.Order];
            for (int i = 0; i < sec.Order; i++)
            {
                x[i] = $"x{++state}";
                w.Line($"C{x[i]} {x[i]} 0 1");
                w.Line($"R{x[i]} {x[i]} 0 1e12");
            }

            // Chain x_i' = w0 x_(i+1); the last state x_m' = w0 (-a0 x1 - ... - a_(m-1) x_m + u). "G 0 n c 0 g" drives g v(c) into n.
            for (int i = 0; i + 1 < sec.Order; i++)
            {
                w.Line($"G{x[i]}c 0 {x[i]} {x[i + 1]} 0 {N(w0)}");
            }

            string last = x[^1];
            for (int i = 0; i < sec.Order; i++)
            {
                if (sec.DenominatorAscending[i] != 0)
                {
                    w.Line($"G{last}a{i} 0 {last} {x[i]} 0 {N(-w0 * sec.DenominatorAscending[i])}");
                }
            }

            w.Line($"G{last}u 0 {last} {u} 0 {N(w0)}");
            string y = $"y{k + 1}";
            w.Line($"R{y} {y} 0 1");
            for (int i = 0; i < sec.Order; i++)
            {
                if (sec.OutputWeight(i) != 0)
                {
                    w.Line($"G{y}x{i + 1} 0 {y} {x[i]} 0 {N(sec.OutputWeight(i))}");
                }
            }

            if (sec.Feedthrough != 0)
            {
                w.Line($"G{y}d 0 {y} {u} 0 {N(sec.Feedthrough)}");
            }

            u = y;
        }

        w.Comment("plant output: the gain K, buffered (the compensator's input resistor loads nothing)");
        w.Line($"Eplant out 0 {u} 0 {N(gain)}");
        double sense = built.Loop.SenseGain;
        LoopCompensatorLines(w, n, design.Plant is BuckPlant b ? b.Feedback : null, sense, amplifierGain);
        w.Comment("loop gain: T = -v(comp) / v(x)");
        w.Line("Et t 0 comp 0 -1");
        Footer(w, s, "vdb(t) vp(t)");
        return w.ToString();
    }

    /// <summary>The compensator parts of the loop: the given network, or the design's own; an op-amp network without R4 gets the buck's divider bottom (as DesignAnalyzer.BuildLoop does).</summary>
    private static Compensator Parts(LoopDesign design, Compensator? network)
    {
        var n = network ?? design.Compensator;
        if (n is not (OpAmpNetwork or TransconductanceNetwork))
        {
            throw new ArgumentException("The design's compensator is a placement, not parts: synthesise the parts first and pass the network.", nameof(network));
        }

        return n is OpAmpNetwork { RBottomOhm: 0.0 } o && design.Plant is BuckPlant buck ? o with { RBottomOhm = buck.Feedback.BottomOhm } : n;
    }

    /// <summary>The compensator from node out (the converter output) to comp: an op-amp network, or the divider and an OTA network.</summary>
    private static void LoopCompensatorLines(Writer w, Compensator n, FeedbackDivider? divider, double ratio, double gain)
    {
        if (n is OpAmpNetwork o)
        {
            NetworkLines(w, o, "out", gain);
            return;
        }

        var t = (TransconductanceNetwork)n;
        if (divider is not null)
        {
            w.Comment("feedback divider ahead of the OTA");
            w.Line($"Rtop out fb {N(divider.TopOhm)}");
            w.Line($"Rbot fb 0 {N(divider.BottomOhm)}");
        }
        else
        {
            w.Comment($"divider ratio Hdiv = {N(ratio)} of the custom plant, as a gain");
            w.Line($"Ediv fb 0 out 0 {N(ratio)}");
        }

        OtaLines(w, t);
    }

    /// <summary>OTA: current gm (0 - v(fb)) into comp, Ro, and the network from comp to ground.</summary>
    private static void OtaLines(Writer w, TransconductanceNetwork network)
    {
        var a = network.Amplifier;
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
    }

    /// <summary>A pure delay from <paramref name="input"/>: a line matched at both ends, v(xd) = v(input) exp(-s Td); returns the delayed node.</summary>
    private static string DelayLines(Writer w, string input, double td)
    {
        if (!(td > 0))
        {
            return input;
        }

        w.Comment($"delay {Format(td, "s", 4)}: line matched at both ends, v(xd) = v({input}) exp(-s Td)");
        w.Line($"Exd xd1 0 {input} 0 2");
        w.Line($"Rxd1 xd1 xd2 {N(DelayLineOhm)}");
        w.Line($"Txd xd2 0 xd 0 Z0={N(DelayLineOhm)} TD={N(td)}");
        w.Line($"Rxd2 xd 0 {N(DelayLineOhm)}");
        return "xd";
    }

    /// <summary>A polynomial in s' from its ascending coefficients, highest power first, zero terms left out.</summary>
    private static string Polynomial(IReadOnlyList<double> ascending)
    {
        var terms = new List<string>();
        for (int i = ascending.Count - 1; i >= 0; i--)
        {
            double c = ascending[i];
            if (c == 0)
            {
                continue;
            }

            string power = i switch { 0 => "", 1 => " s'", _ => $" s'^{i}" };
            terms.Add(c.ToString("G6", CultureInfo.InvariantCulture) + power);
        }

        return terms.Count == 0 ? "0" : string.Join(" + ", terms).Replace("+ -", "- ", StringComparison.Ordinal);
    }

    private static string DescribeCompensator(Compensator n) => n switch
    {
        OpAmpNetwork o => $"{Describe(o.Type)} op-amp compensator" + (o.Amplifier is OpAmp ? " (op-amp macro-model)" : " (ideal amplifier)"),
        TransconductanceNetwork t => string.Create(CultureInfo.InvariantCulture, $"{Describe(t.Type)} OTA compensator (gm = {Format(t.Amplifier.TransconductanceS, "S", 4)}, Ro = {Format(t.Amplifier.OutputResistanceOhm, "Ohm", 4)})"),
        _ => "compensator",
    };

    private static string DescribeModel(SmallSignalModel m) => m switch
    {
        SmallSignalModel.VoltageModeContinuous => "voltage-mode CCM",
        SmallSignalModel.VoltageModeDiscontinuous => "voltage-mode DCM",
        SmallSignalModel.PeakCurrentModeContinuous => "peak current-mode CCM",
        SmallSignalModel.PeakCurrentModeDiscontinuous => "peak current-mode DCM",
        _ => "custom",
    };

    private static string ModelSource(SmallSignalModel m) => m switch
    {
        SmallSignalModel.VoltageModeContinuous => "voltage-mode CCM averaged model (Erickson and Maksimovic, 2nd ed., sec. 7.2 and 8.2)",
        SmallSignalModel.VoltageModeDiscontinuous => "voltage-mode full-order averaged DCM model (Sun et al. 2001)",
        SmallSignalModel.PeakCurrentModeContinuous => "peak current-mode CCM model with Ridley's sampling terms (Ridley 1991)",
        SmallSignalModel.PeakCurrentModeDiscontinuous => "peak current-mode full-order averaged DCM model with the peak-current duty-cycle law",
        _ => "custom plant transfer function as entered (modulator included)",
    };

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
        OtaLines(w, network);
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
