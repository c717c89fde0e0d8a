using System.Collections.Immutable;
using LoopShaper.Core.Corners;

namespace LoopShaper.Web.Model;

/// <summary>
/// The form state of the design file's "tolerances" section (docs/design-file.md): one field per tolerance of the power
/// stage, modulator and amplifier, each keeping its raw text, and one optional band and DC-bias factor per output
/// capacitor branch (following the branch when it is renamed or moved). A design without the section gets none back as
/// long as every field still holds its default.
/// </summary>
public sealed class TolerancesForm
{
    private const string T = "tolerances";
    private readonly ToleranceSpec? _original;
    private readonly IReadOnlyList<CapacitorBranchForm> _branches;
    private readonly Dictionary<CapacitorBranchForm, CapacitorToleranceForm> _byBranch = [];

    /// <summary>A form showing <paramref name="spec"/> (null: the design has no section, the defaults are shown) for the live list of capacitor branches.</summary>
    public TolerancesForm(ToleranceSpec? spec, IReadOnlyList<CapacitorBranchForm> branches)
    {
        _original = spec;
        _branches = branches;
        var s = spec ?? ToleranceSpec.Default;
        foreach (var b in branches)
        {
            _byBranch[b] = new CapacitorToleranceForm(s.Capacitors.TryGetValue(b.Label, out var entry) ? entry : null);
        }

        Inductance = new($"{T}.inductancePct", "Inductance L, ±", "%", s.InductancePct);
        Capacitance = new($"{T}.capacitancePct", "Output capacitors, ±", "%", s.CapacitancePct);
        DcBias = new($"{T}.dcBiasFactor", "Capacitance left under DC bias", string.Empty, s.DcBiasFactor, "× C");
        EsrLow = new($"{T}.esrLowFactor", "ESR over temperature, lowest", string.Empty, s.EsrLowFactor, "× ESR");
        EsrHigh = new($"{T}.esrHighFactor", "ESR over temperature, highest", string.Empty, s.EsrHighFactor, "× ESR");
        DcrLow = new($"{T}.dcrLowFactor", "DCR over temperature, lowest", string.Empty, s.DcrLowFactor, "× DCR");
        DcrHigh = new($"{T}.dcrHighFactor", "DCR over temperature, highest", string.Empty, s.DcrHighFactor, "× DCR");
        SenseGain = new($"{T}.senseGainPct", "Current-sense gain Ri, ±", "%", s.SenseGainPct);
        Ramp = new($"{T}.rampPct", "Ramp, ±", "%", s.RampPct);
        Transconductance = new($"{T}.transconductancePct", "OTA gm, ±", "%", s.TransconductancePct);
        Build();
    }

    /// <summary>tolerances.inductancePct.</summary>
    public FieldState Inductance { get; }

    /// <summary>tolerances.capacitancePct.</summary>
    public FieldState Capacitance { get; }

    /// <summary>tolerances.dcBiasFactor.</summary>
    public FieldState DcBias { get; }

    /// <summary>tolerances.esrLowFactor.</summary>
    public FieldState EsrLow { get; }

    /// <summary>tolerances.esrHighFactor.</summary>
    public FieldState EsrHigh { get; }

    /// <summary>tolerances.dcrLowFactor.</summary>
    public FieldState DcrLow { get; }

    /// <summary>tolerances.dcrHighFactor.</summary>
    public FieldState DcrHigh { get; }

    /// <summary>tolerances.senseGainPct.</summary>
    public FieldState SenseGain { get; }

    /// <summary>tolerances.rampPct.</summary>
    public FieldState Ramp { get; }

    /// <summary>tolerances.transconductancePct.</summary>
    public FieldState Transconductance { get; }

    /// <summary>Every field, in the order shown, the branches' last.</summary>
    public IReadOnlyList<FieldState> Fields => [Inductance, Capacitance, DcBias, EsrLow, EsrHigh, DcrLow, DcrHigh, SenseGain, Ramp, Transconductance,
        .. _branches.SelectMany(b => new[] { For(b).TolerancePct, For(b).DcBiasFactor })];

    /// <summary>Entries of the loaded section whose label names no branch of the form (kept as loaded; the core reports them).</summary>
    public IReadOnlyList<string> UnmatchedLabels => [.. (_original?.Capacitors.Keys ?? []).Where(l => !_branches.Any(b => b.Label == l))];

    /// <summary>The tolerance fields of a branch (a branch added since the form was made starts empty).</summary>
    public CapacitorToleranceForm For(CapacitorBranchForm branch)
    {
        if (!_byBranch.TryGetValue(branch, out var form))
        {
            form = new CapacitorToleranceForm(null);
            form.SetPath($"{T}.branch{_byBranch.Count}");
            _byBranch[branch] = form;
        }

        return form;
    }

    /// <summary>The section from the last readable value of every field; null when the design had none and nothing was changed.</summary>
    public ToleranceSpec? Build()
    {
        var entries = ImmutableSortedDictionary.CreateBuilder<string, CapacitorTolerance>(StringComparer.Ordinal);
        foreach (var (label, kept) in _original?.Capacitors ?? ImmutableSortedDictionary<string, CapacitorTolerance>.Empty)
        {
            if (!_branches.Any(b => b.Label == label))
            {
                entries[label] = kept;
            }
        }

        foreach (var b in _branches.Where(b => For(b).HasEntry))
        {
            var f = For(b);
            entries[b.Label] = new CapacitorTolerance(f.TolerancePct.Value ?? V(Capacitance), f.DcBiasFactor.Value ?? V(DcBias));
        }

        // Paths as the core numbers the entries: their place in label order; a branch without an entry gets a placeholder.
        var labels = entries.Keys.ToList();
        for (int i = 0; i < _branches.Count; i++)
        {
            var f = For(_branches[i]);
            int k = f.HasEntry ? labels.IndexOf(_branches[i].Label) : -1;
            f.SetPath(k >= 0 ? $"{T}.capacitors[{k}]" : $"{T}.branch{i}");
        }

        var spec = (_original ?? ToleranceSpec.Default) with
        {
            Capacitors = entries.ToImmutable(),
            InductancePct = V(Inductance),
            CapacitancePct = V(Capacitance),
            DcBiasFactor = V(DcBias),
            EsrLowFactor = V(EsrLow),
            EsrHighFactor = V(EsrHigh),
            DcrLowFactor = V(DcrLow),
            DcrHighFactor = V(DcrHigh),
            SenseGainPct = V(SenseGain),
            RampPct = V(Ramp),
            TransconductancePct = V(Transconductance),
        };
        return _original is null && entries.Count == 0 && spec == (ToleranceSpec.Default with { Capacitors = spec.Capacitors }) ? null : spec;
    }

    private static double V(FieldState f) => f.Value ?? double.NaN;
}
