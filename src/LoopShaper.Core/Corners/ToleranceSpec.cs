using System.Collections.Immutable;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>
/// The tolerances of the power stage, modulator and amplifier for the corner and Monte Carlo analyses (the design
/// file's "tolerances" section, docs/design-file.md). A tolerance in % is the half-width of a symmetric band; a
/// temperature multiplier range scales the entered value from its lowest to its highest over temperature. The
/// compensator's parts take their tolerances from the synthesis settings (1 % resistors, 5 % capacitors by default).
/// Defaults, common practice, no source: L +-20 %, output capacitors +-20 % with no DC-bias derating, ESR x0.8 to x2,
/// current-sense gain +-10 %, ramp +-10 %, gm +-20 %. DCR x0.75 to x1.4: copper's 0.393 %/K from -40 to 125 degC
/// around 25 degC (from memory).
/// </summary>
public sealed record ToleranceSpec
{
    /// <summary>The defaults.</summary>
    public static ToleranceSpec Default { get; } = new();

    /// <summary>Inductance tolerance, +- %, 0 to 90.</summary>
    public double InductancePct { get; init; } = 20.0;

    /// <summary>Capacitance tolerance of every branch not named in <see cref="Capacitors"/>, +- %, 0 to 90.</summary>
    public double CapacitancePct { get; init; } = 20.0;

    /// <summary>DC-bias factor of every branch not named in <see cref="Capacitors"/>, 0.05 to 1.</summary>
    public double DcBiasFactor { get; init; } = 1.0;

    /// <summary>Tolerances of single output-capacitor branches, by their label.</summary>
    public ImmutableSortedDictionary<string, CapacitorTolerance> Capacitors { get; init; } = ImmutableSortedDictionary.Create<string, CapacitorTolerance>(StringComparer.Ordinal);

    /// <summary>Lowest ESR over temperature as a multiple of the entered ESR, 0.1 to 1.</summary>
    public double EsrLowFactor { get; init; } = 0.8;

    /// <summary>Highest ESR over temperature as a multiple of the entered ESR, 1 to 10.</summary>
    public double EsrHighFactor { get; init; } = 2.0;

    /// <summary>Lowest DCR over temperature as a multiple of the entered DCR, 0.1 to 1.</summary>
    public double DcrLowFactor { get; init; } = 0.75;

    /// <summary>Highest DCR over temperature as a multiple of the entered DCR, 1 to 10.</summary>
    public double DcrHighFactor { get; init; } = 1.4;

    /// <summary>Current-sense gain tolerance (peak current mode), +- %, 0 to 90.</summary>
    public double SenseGainPct { get; init; } = 10.0;

    /// <summary>Ramp tolerance (Vm, Se or mc - 1), +- %, 0 to 90.</summary>
    public double RampPct { get; init; } = 10.0;

    /// <summary>Transconductance tolerance of an OTA, +- %, 0 to 90.</summary>
    public double TransconductancePct { get; init; } = 20.0;

    /// <summary>The tolerance of a capacitor branch: its own entry, else the defaults of this spec.</summary>
    public CapacitorTolerance For(CapacitorBranch branch)
        => Capacitors.TryGetValue(branch.Label, out var t) ? t : new CapacitorTolerance(CapacitancePct, DcBiasFactor);
}
