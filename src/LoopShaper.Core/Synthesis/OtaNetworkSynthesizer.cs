using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Component synthesis for the OTA Type II network with gm fixed: R2, C1, C2 from the placement (the exact inverse,
/// <see cref="OtaSynthesis.TypeII"/>), each snapped to its series, the loop analysed with both. The compensator's
/// transfer function is taken from the divided output (the divider is the loop's sense gain), so the inverse is called
/// with Hdiv = 1 and the rest of the loop carries Hdiv. An optional search over neighbouring preferred values of R2, C1
/// and C2 (<see cref="NeighbourSearch"/>; gm and the divider stay fixed) keeps crossover and phase margin closest to the targets.
/// </summary>
public static class OtaNetworkSynthesizer
{
    private const string Source = "inverse of fi = gm / (2 pi (C1 + C2)), fz = 1 / (2 pi R2 C1), fp = (C1 + C2) / (2 pi R2 C1 C2) (Basso 2012, ch. 3, OTA Type II)";

    /// <summary>The parts list of an OTA network: R2, C1, C2 (Type II) or C1 (Type I), with their roles.</summary>
    public static IReadOnlyList<(string Designator, PartKind Kind, string Role, double Value)> PartsOf(TransconductanceNetwork n)
        => n.Type == CompensatorType.TypeI
            ? [("C1", PartKind.Capacitor, "integrator capacitor, OTA output to ground; sets fi with gm", n.C1F)]
            : [
                ("R2", PartKind.Resistor, "resistor in series with C1, OTA output to ground; the zero", n.R2Ohm),
                ("C1", PartKind.Capacitor, "capacitor in series with R2; integrator and the zero", n.C1F),
                ("C2", PartKind.Capacitor, "capacitor across R2 + C1, OTA output to ground; the pole", n.C2F),
            ];

    /// <summary>The network with the preferred values of a part list (R2, C1, C2); gm, Ro and the type stay.</summary>
    public static TransconductanceNetwork With(TransconductanceNetwork n, IEnumerable<SynthesizedPart> parts)
        => parts.Aggregate(n, (acc, p) => p.Designator switch
        {
            "R2" => acc with { R2Ohm = p.Value.Value },
            "C1" => acc with { C1F = p.Value.Value },
            "C2" => acc with { C2F = p.Value.Value },
            _ => throw new ArgumentException($"'{p.Designator}' is not a part of an OTA network (R2, C1, C2).", nameof(parts)),
        });

    /// <summary>
    /// Synthesises the OTA Type II network of a placement. <paramref name="restOfLoop"/> is the loop without the
    /// compensator, divider included (Hdiv Fm Gvd), used to resolve a crossover target and for the margins.
    /// Throws <see cref="ArgumentException"/> for bad options or a placement no OTA Type II network realises.
    /// </summary>
    public static OtaNetworkSynthesis Synthesize(TransferFunction restOfLoop, CompensatorPlacement placement, Transconductance amplifier, SynthesisOptions o)
    {
        var errors = NetworkSynthesizer.Validate(o).Where(i => i.Severity == Validation.Severity.Error).ToList();
        if (errors.Count > 0)
        {
            throw new ArgumentException(string.Join(" ", errors), nameof(o));
        }

        if (placement.Type != CompensatorType.TypeII)
        {
            throw new ArgumentException($"compensator.type: the OTA synthesis makes a Type II network; the placement is {placement.Type}.", nameof(placement));
        }

        var inv = CultureInfo.InvariantCulture;
        double start = o.StartHz ?? 10.0, stop = o.StopHz ?? 1e6;
        double fi = placement.IntegratorHz(restOfLoop);
        placement = placement with { Gain = new GainSetting(GainSettingKind.IntegratorHz, fi) };
        double fz = placement.Zero1Hz ?? double.NaN, fp = placement.Pole1Hz ?? double.NaN;
        if (!(fz > 0) || !(fp > fz) || !double.IsFinite(fp))
        {
            throw new ArgumentException(string.Create(inv, $"compensator: an OTA Type II network puts its pole above its zero, but the zero is at {fz:G4} Hz and the pole at {fp:G4} Hz."), nameof(placement));
        }

        double gm = amplifier.TransconductanceS;
        var values = OtaSynthesis.TypeII(gm, 1.0, fi, fz, fp);
        var ideal = new TransconductanceNetwork(CompensatorType.TypeII, amplifier, values.C1F, values.R2Ohm, values.C2F);
        double total = values.C1F + values.C2F;
        var steps = new List<Derivation>
        {
            new("C1 + C2", "C1 + C2 = gm / (2 pi fi)", $"C1 + C2 = {Format(gm, "S", 4)} / (2 pi x {Format(fi, "Hz", 4)})", Format(total, "F", 4), Source),
            new("C2", "C2 = (C1 + C2) fz / fp", $"C2 = {Format(total, "F", 4)} x {Format(fz, "Hz", 4)} / {Format(fp, "Hz", 4)}", Format(values.C2F, "F", 4), Source),
            new("C1", "C1 = (C1 + C2) - C2", $"C1 = {Format(total, "F", 4)} - {Format(values.C2F, "F", 4)}", Format(values.C1F, "F", 4), Source),
            new("R2", "R2 = 1 / (2 pi fz C1)", $"R2 = 1 / (2 pi x {Format(fz, "Hz", 4)} x {Format(values.C1F, "F", 4)})", Format(values.R2Ohm, "Ohm", 4), Source),
        };

        var parts = PartsOf(ideal).Select(p => new SynthesizedPart(p.Designator, p.Kind, p.Role, StandardValues.Snap(p.Value, p.Kind == PartKind.Resistor ? o.ResistorSeries : o.CapacitorSeries), o.ToleranceOf(p.Designator, p.Kind))).ToImmutableArray();
        foreach (var p in parts)
        {
            steps.Add(new($"{p.Designator} snapped to {p.Value.Series}", "nearest preferred value in log distance, ties to the larger (IEC 60063)",
                $"ideal {Format(p.Value.IdealValue, p.Unit, 4)}", string.Create(inv, $"{Format(p.Value.Value, p.Unit, 3)} ({p.Value.ErrorPct:+0.00;-0.00;0.00} %)"), "IEC 60063:2015"));
        }

        var snapped = With(ideal, parts);
        var idealPerf = LoopPerformance.From(MarginAnalyzer.Analyze(ideal.TransferFunction().Multiply(restOfLoop), start, stop));
        var snappedPerf = LoopPerformance.From(MarginAnalyzer.Analyze(snapped.TransferFunction().Multiply(restOfLoop), start, stop));
        steps.Add(Compare("Loop with the ideal parts", idealPerf));
        steps.Add(Compare("Loop with the snapped parts", snappedPerf));
        double fcTarget = o.TargetCrossoverHz ?? idealPerf.CrossoverHz ?? double.NaN;
        double pmTarget = o.TargetPhaseMarginDeg ?? idealPerf.PhaseMarginDeg ?? double.NaN;

        var warnings = new List<string>();
        var (search, searchSteps, searchWarnings) = NeighbourSearch.Apply(
            restOfLoop, snapped, parts, _ => false, With, "gm and the divider fixed", Compare, o, fcTarget, pmTarget, start, stop);
        steps.AddRange(searchSteps);
        warnings.AddRange(searchWarnings);
        if (o.R1Ohm is not null)
        {
            warnings.Add("R1 anchors the op-amp networks only; the OTA network is anchored by gm, and its divider is the design's plant.feedback.");
        }

        foreach (var p in search?.Parts ?? parts)
        {
            double v = p.Value.Value;
            if (p.Kind == PartKind.Resistor && (v < NetworkSynthesizer.MinPracticalResistorOhm || v > NetworkSynthesizer.MaxPracticalResistorOhm))
            {
                warnings.Add($"{p.Designator} = {Format(v, "Ohm")} is outside 1 kOhm to 1 MOhm (common practice, no source); a different gm moves every value.");
            }

            if (p.Kind == PartKind.Capacitor && v < NetworkSynthesizer.MinPracticalCapacitorF)
            {
                warnings.Add($"{p.Designator} = {Format(v, "F")} is below 10 pF (common practice, no source): board and amplifier strays are of that size; a higher gm raises it.");
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

        return new OtaNetworkSynthesis
        {
            Placement = placement,
            IdealNetwork = ideal,
            SnappedNetwork = snapped,
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

    private static Derivation Compare(string what, LoopPerformance p)
    {
        var inv = CultureInfo.InvariantCulture;
        string fc = p.CrossoverHz is double f ? Format(f, "Hz", 4) : "no crossover in range";
        string pm = p.PhaseMarginDeg is double m ? m.ToString("F2", inv) + " deg" : "n/a";
        string gm = p.GainMarginDb is double g ? g.ToString("F2", inv) + " dB" : "no phase crossover in range";
        return new(what, "MarginAnalyzer on Gc H Fm Gvd (Ro included): worst crossover, its phase margin, upper gain margin", $"fc = {fc}, PM = {pm}, GM = {gm}", p.IsClosedLoopStable ? "closed loop stable" : "closed loop UNSTABLE", "shared conventions: margins against -180 degrees");
    }
}
