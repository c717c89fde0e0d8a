using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Component synthesis for the op-amp Type I, II and III networks: ideal values from a placement (the exact inverse of
/// the network's formulas), each part snapped to its preferred-value series, the loop analysed with both, and an
/// optional search over neighbouring preferred values.
/// </summary>
public static class NetworkSynthesizer
{
    /// <summary>Lowest practical resistor, ohms: common practice, no source.</summary>
    public const double MinPracticalResistorOhm = 1e3;

    /// <summary>Highest practical resistor, ohms: common practice, no source.</summary>
    public const double MaxPracticalResistorOhm = 1e6;

    /// <summary>Lowest practical capacitor, farads (board strays are a few pF): common practice, no source.</summary>
    public const double MinPracticalCapacitorF = 10e-12;

    private const string NetworkSource = "inverse of fi = 1/(2 pi R1 (C1 + C2)), fz1 = 1/(2 pi R2 C1), fp1 = (C1 + C2)/(2 pi R2 C1 C2), fz2 = 1/(2 pi (R1 + R3) C3), fp2 = 1/(2 pi R3 C3) (Venable 1983; Basso 2012, ch. 3)";

    /// <summary>Checks the options; errors name the field and the allowed range.</summary>
    public static ImmutableArray<ValidationIssue> Validate(SynthesisOptions o)
    {
        var c = new Checks();
        if (o.R1Ohm is double r1)
        {
            c.Above("synthesis.r1Ohm", r1, 0.0, 1e9, "Ohm");
        }

        if (!SynthesisOptions.ResistorSeriesAllowed.Contains(o.ResistorSeries))
        {
            c.Error("synthesis.resistorSeries", $"{o.ResistorSeries} is not offered for resistors: allowed E24, E48, E96, E192.");
        }

        if (!SynthesisOptions.CapacitorSeriesAllowed.Contains(o.CapacitorSeries))
        {
            c.Error("synthesis.capacitorSeries", $"{o.CapacitorSeries} is not offered for capacitors: allowed E6, E12, E24.");
        }

        c.InRange("synthesis.resistorTolerancePct", o.ResistorTolerance.TolerancePct, 0.0, 50.0, "%");
        c.InRange("synthesis.capacitorTolerancePct", o.CapacitorTolerance.TolerancePct, 0.0, 50.0, "%");
        foreach (var (d, t) in o.Tolerances)
        {
            c.InRange($"synthesis.tolerances.{d}", t.TolerancePct, 0.0, 50.0, "%");
        }

        if (o.SearchSteps is < 1 or > 3)
        {
            c.Error("synthesis.searchSteps", $"{o.SearchSteps} is out of range: allowed 1 to 3.");
        }

        c.Above("synthesis.crossoverScalePct", o.CrossoverScalePct, 0.0, 1e3, "%");
        c.Above("synthesis.phaseMarginScaleDeg", o.PhaseMarginScaleDeg, 0.0, 180.0, "deg");
        if (o.TargetCrossoverHz is double fc)
        {
            c.Above("synthesis.targetCrossoverHz", fc, 0.0, 1e9, "Hz");
        }

        if (o.TargetPhaseMarginDeg is double pm)
        {
            c.Above("synthesis.targetPhaseMarginDeg", pm, -180.0, 180.0, "deg");
        }

        if (o.StartHz is double a && c.Above("synthesis.startHz", a, 0.0, 1e10, "Hz") && o.StopHz is double b)
        {
            c.Above("synthesis.stopHz", b, a, 1e12, "Hz");
        }

        if (o.OutputVoltageV is double vo && o.ReferenceV is double vr && c.Above("synthesis.referenceV", vr, 0.0, 1e4, "V"))
        {
            c.Above("synthesis.outputVoltageV", vo, vr, 1e4, "V");
        }

        return [.. c.Issues];
    }

    /// <summary>Synthesises the parts of a design's compensator (its placement, or the placement its parts give) at the operating point of its analysis settings.</summary>
    public static NetworkSynthesis Synthesize(LoopDesign design, SynthesisOptions? options = null)
    {
        var o = options ?? new SynthesisOptions();
        var plant = DesignAnalyzer.BuildLoop(design).Loop.Plant;
        var placement = DesignAnalyzer.Resolve(design.Compensator, plant);
        var buck = design.Plant as BuckPlant;
        o = o with
        {
            R1Ohm = o.R1Ohm ?? buck?.Feedback.TopOhm ?? (design.Compensator as OpAmpNetwork)?.R1Ohm,
            StartHz = o.StartHz ?? design.Analysis.StartHz,
            StopHz = o.StopHz ?? design.Analysis.StopHz,
            OutputVoltageV = o.OutputVoltageV ?? buck?.PowerStage.OutputVoltageV,
            ReferenceV = o.ReferenceV ?? buck?.Feedback.ReferenceV,
            TargetCrossoverHz = o.TargetCrossoverHz ?? (design.Compensator is CompensatorPlacement { Gain.Kind: GainSettingKind.CrossoverHz } p ? p.Gain.Value : null),
        };
        return Synthesize(plant, placement, o);
    }

    /// <summary>
    /// Synthesises the op-amp network of a placement for the plant Fm Gvd. Throws <see cref="ArgumentException"/> with
    /// the validation messages for bad options or a placement no op-amp network realises.
    /// </summary>
    public static NetworkSynthesis Synthesize(TransferFunction plant, CompensatorPlacement placement, SynthesisOptions options)
    {
        if (!TrySynthesize(plant, placement, options, out var result, out var issues))
        {
            throw new ArgumentException(string.Join(" ", issues.Where(i => i.Severity == Severity.Error)), nameof(options));
        }

        return result!;
    }

    /// <summary>Synthesises; false with the reasons when the options are bad or no op-amp network realises the placement.</summary>
    public static bool TrySynthesize(TransferFunction plant, CompensatorPlacement placement, SynthesisOptions options, out NetworkSynthesis? result, out ImmutableArray<ValidationIssue> issues)
    {
        result = null;
        issues = Validate(options);
        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return false;
        }

        try
        {
            result = Run(plant, placement, options);
            return true;
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException)
        {
            issues = issues.Add(new ValidationIssue("compensator", ex.Message.Split(" (Parameter")[0]));
            return false;
        }
    }

    private static NetworkSynthesis Run(TransferFunction plant, CompensatorPlacement placement0, SynthesisOptions o)
    {
        var inv = CultureInfo.InvariantCulture;
        var steps = new List<Derivation>();
        var warnings = new List<string>();
        double start = o.StartHz ?? 10.0, stop = o.StopHz ?? 1e6;
        var placement = placement0 with { Gain = new GainSetting(GainSettingKind.IntegratorHz, placement0.IntegratorHz(plant)) };

        // The anchor first: R1 at a preferred value, so that only the other parts carry snapping errors.
        double r1Asked = o.R1Ohm ?? OpAmpSynthesis.DefaultR1Ohm;
        var r1 = StandardValues.Snap(r1Asked, o.ResistorSeries);
        if (Math.Abs(r1.Value - r1Asked) > 1e-9 * r1Asked)
        {
            warnings.Add($"R1 = {Format(r1Asked, "Ohm", 4)} is not an {o.ResistorSeries} value; the synthesis uses {Format(r1.Value, "Ohm", 4)} and computes the other parts from it.");
        }

        double rBottom = o.OutputVoltageV is double vo && o.ReferenceV is double vr ? OpAmpSynthesis.BottomResistorOhm(r1.Value, vo, vr) : 0.0;
        var ideal = OpAmpSynthesis.IdealNetwork(placement, r1.Value, plant, rBottom);
        steps.AddRange(IdealSteps(placement, ideal, o));

        var parts = OpAmpNetworkParts.Of(ideal).Select(p =>
        {
            var series = p.Kind == PartKind.Resistor ? o.ResistorSeries : o.CapacitorSeries;
            var snapped = p.Designator == "R1" ? r1 : StandardValues.Snap(p.Value, series);
            return new SynthesizedPart(p.Designator, p.Kind, p.Role, snapped, o.ToleranceOf(p.Designator, p.Kind));
        }).ToImmutableArray();
        foreach (var p in parts)
        {
            steps.Add(new($"{p.Designator} snapped to {p.Value.Series}", "nearest preferred value in log distance, ties to the larger (IEC 60063)",
                $"ideal {Format(p.Value.IdealValue, p.Unit, 4)}", string.Create(inv, $"{Format(p.Value.Value, p.Unit, 3)} ({p.Value.ErrorPct:+0.00;-0.00;0.00} %)"), "IEC 60063:2015"));
        }

        var snappedNetwork = OpAmpNetworkParts.With(ideal, parts);
        var idealPerf = LoopPerformance.From(MarginAnalyzer.Analyze(ideal.TransferFunction().Multiply(plant), start, stop));
        var snappedPerf = LoopPerformance.From(MarginAnalyzer.Analyze(snappedNetwork.TransferFunction().Multiply(plant), start, stop));
        double fcTarget = o.TargetCrossoverHz ?? idealPerf.CrossoverHz ?? double.NaN;
        double pmTarget = o.TargetPhaseMarginDeg ?? idealPerf.PhaseMarginDeg ?? double.NaN;
        steps.Add(Compare("Loop with the ideal parts", idealPerf));
        steps.Add(Compare("Loop with the snapped parts", snappedPerf));
        if (rBottom > 0)
        {
            double r4 = parts.First(p => p.Designator == OpAmpNetworkParts.DividerBottom).Value.Value;
            double vref = o.ReferenceV!.Value;
            double vout = vref * (1 + (r1.Value / r4));
            steps.Add(new("Output voltage with the snapped divider", "Vout = Vref (1 + R1 / R4)", $"Vout = {Format(vref, "V", 4)} x (1 + {Format(r1.Value, "Ohm", 4)} / {Format(r4, "Ohm", 4)})",
                string.Create(inv, $"{Format(vout, "V", 4)} ({100 * ((vout / o.OutputVoltageV!.Value) - 1):+0.00;-0.00;0.00} %)"), "voltage divider"));
        }

        var (search, searchSteps, searchWarnings) = NeighbourSearch.Apply(
            plant, snappedNetwork, parts, d => d is "R1" or OpAmpNetworkParts.DividerBottom, OpAmpNetworkParts.With, "R1 and R4 fixed", Compare, o, fcTarget, pmTarget, start, stop);
        steps.AddRange(searchSteps);
        warnings.AddRange(searchWarnings);

        var chosen = search?.Parts ?? parts;
        foreach (var p in chosen)
        {
            double v = p.Value.Value;
            if (p.Kind == PartKind.Resistor && (v < MinPracticalResistorOhm || v > MaxPracticalResistorOhm))
            {
                warnings.Add($"{p.Designator} = {Format(v, "Ohm")} is outside 1 kOhm to 1 MOhm (common practice, no source): {(v < MinPracticalResistorOhm ? "it loads the amplifier and the divider" : "leakage and noise make it unreliable")}; change R1 to move every value.");
            }

            if (p.Kind == PartKind.Capacitor && v < MinPracticalCapacitorF)
            {
                warnings.Add($"{p.Designator} = {Format(v, "F")} is below 10 pF (common practice, no source): board and amplifier strays are of that size; lower R1 to raise it.");
            }
        }

        var final = search?.Performance ?? snappedPerf;
        if (!final.IsClosedLoopStable)
        {
            warnings.Add("The loop with the chosen parts is UNSTABLE.");
        }
        else if (final.PhaseMarginDeg is double pmFinal && !double.IsNaN(pmTarget) && pmFinal < pmTarget - 1.0)
        {
            warnings.Add(string.Create(inv, $"The chosen parts give {pmFinal:F1} deg of phase margin, {pmTarget - pmFinal:F1} deg below the {pmTarget:F1} deg aimed for."));
        }

        return new NetworkSynthesis
        {
            Placement = placement,
            IdealNetwork = ideal,
            SnappedNetwork = snappedNetwork,
            Parts = parts,
            Ideal = idealPerf,
            Snapped = snappedPerf,
            Search = search,
            TargetCrossoverHz = fcTarget,
            TargetPhaseMarginDeg = pmTarget,
            Derivations = [.. steps],
            Warnings = [.. warnings],
        };
    }

    private static IEnumerable<Derivation> IdealSteps(CompensatorPlacement p, OpAmpNetwork n, SynthesisOptions o)
    {
        double fi = p.Gain.Value;
        if (n.Type == CompensatorType.TypeI)
        {
            yield return new("C1", "C1 = 1 / (2 pi R1 fi)", $"C1 = 1 / (2 pi x {Format(n.R1Ohm, "Ohm", 4)} x {Format(fi, "Hz", 4)})", Format(n.C1F, "F", 4), NetworkSource);
        }
        else
        {
            double total = n.C1F + n.C2F;
            double z1 = 1.0 / (2 * Math.PI * n.R2Ohm * n.C1F), p1 = total / (2 * Math.PI * n.R2Ohm * n.C1F * n.C2F);
            yield return new("C1 + C2", "C1 + C2 = 1 / (2 pi R1 fi)", $"C1 + C2 = 1 / (2 pi x {Format(n.R1Ohm, "Ohm", 4)} x {Format(fi, "Hz", 4)})", Format(total, "F", 4), NetworkSource);
            yield return new("C2", "C2 = (C1 + C2) fz1 / fp1", $"C2 = {Format(total, "F", 4)} x {Format(z1, "Hz", 4)} / {Format(p1, "Hz", 4)}", Format(n.C2F, "F", 4), NetworkSource);
            yield return new("C1", "C1 = (C1 + C2) - C2", $"C1 = {Format(total, "F", 4)} - {Format(n.C2F, "F", 4)}", Format(n.C1F, "F", 4), NetworkSource);
            yield return new("R2", "R2 = 1 / (2 pi fz1 C1)", $"R2 = 1 / (2 pi x {Format(z1, "Hz", 4)} x {Format(n.C1F, "F", 4)})", Format(n.R2Ohm, "Ohm", 4), NetworkSource);
        }

        if (n.Type == CompensatorType.TypeIII)
        {
            double z2 = 1.0 / (2 * Math.PI * (n.R1Ohm + n.R3Ohm) * n.C3F), p2 = 1.0 / (2 * Math.PI * n.R3Ohm * n.C3F);
            yield return new("R3", "R3 = R1 fz2 / (fp2 - fz2), from fp2 / fz2 = (R1 + R3) / R3", $"R3 = {Format(n.R1Ohm, "Ohm", 4)} x {Format(z2, "Hz", 4)} / ({Format(p2, "Hz", 4)} - {Format(z2, "Hz", 4)})", Format(n.R3Ohm, "Ohm", 4), NetworkSource);
            yield return new("C3", "C3 = 1 / (2 pi R3 fp2)", $"C3 = 1 / (2 pi x {Format(n.R3Ohm, "Ohm", 4)} x {Format(p2, "Hz", 4)})", Format(n.C3F, "F", 4), NetworkSource);
        }

        if (n.RBottomOhm > 0)
        {
            yield return new("R4 (divider bottom)", "R4 = R1 Vref / (Vout - Vref)", $"R4 = {Format(n.R1Ohm, "Ohm", 4)} x {Format(o.ReferenceV ?? 0, "V", 4)} / ({Format(o.OutputVoltageV ?? 0, "V", 4)} - {Format(o.ReferenceV ?? 0, "V", 4)})", Format(n.RBottomOhm, "Ohm", 4), "voltage divider");
        }
    }

    private static Derivation Compare(string what, LoopPerformance p)
    {
        var inv = CultureInfo.InvariantCulture;
        string fc = p.CrossoverHz is double f ? Format(f, "Hz", 4) : "no crossover in range";
        string pm = p.PhaseMarginDeg is double m ? m.ToString("F2", inv) + " deg" : "n/a";
        string gm = p.GainMarginDb is double g ? g.ToString("F2", inv) + " dB" : "no phase crossover in range";
        return new(what, "MarginAnalyzer on Gc Fm Gvd: worst crossover, its phase margin, upper gain margin", $"fc = {fc}, PM = {pm}, GM = {gm}", p.IsClosedLoopStable ? "closed loop stable" : "closed loop UNSTABLE", "shared conventions: margins against -180 degrees");
    }
}
