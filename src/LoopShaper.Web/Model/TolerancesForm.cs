using LoopShaper.Core.Corners;

namespace LoopShaper.Web.Model;

/// <summary>
/// The form state of the design file's "tolerances" section (docs/design-file.md): one field per tolerance of the power
/// stage, modulator and amplifier, each keeping its raw text. The per-branch capacitor entries travel unchanged. A
/// design without the section gets none back as long as every field still holds its default.
/// </summary>
public sealed class TolerancesForm
{
    private const string T = "tolerances";
    private readonly ToleranceSpec? _original;

    /// <summary>A form showing <paramref name="spec"/> (null: the design has no section, the defaults are shown).</summary>
    public TolerancesForm(ToleranceSpec? spec)
    {
        _original = spec;
        var s = spec ?? ToleranceSpec.Default;
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

    /// <summary>Every field, in the order shown.</summary>
    public IReadOnlyList<FieldState> Fields => [Inductance, Capacitance, DcBias, EsrLow, EsrHigh, DcrLow, DcrHigh, SenseGain, Ramp, Transconductance];

    /// <summary>The capacitor branches with an entry of their own (kept as loaded; not edited here).</summary>
    public int CapacitorEntries => _original?.Capacitors.Count ?? 0;

    /// <summary>The section from the last readable value of every field; null when the design had none and nothing was changed.</summary>
    public ToleranceSpec? Build()
    {
        var spec = (_original ?? ToleranceSpec.Default) with
        {
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
        return _original is null && spec == ToleranceSpec.Default ? null : spec;
    }

    private static double V(FieldState f) => f.Value ?? double.NaN;
}
