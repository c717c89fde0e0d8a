namespace LoopShaper.Web.Model;

/// <summary>
/// The tolerance of one output-capacitor branch of the form (an entry of tolerances.capacitors): both fields optional,
/// an empty one takes the section's value for every branch. The paths follow the entry's place among the entries in
/// label order, as the core's validation numbers them; they are set by <see cref="TolerancesForm.Build"/>.
/// </summary>
public sealed class CapacitorToleranceForm
{
    /// <summary>A form for a branch, from its entry (null: none).</summary>
    public CapacitorToleranceForm(Core.Corners.CapacitorTolerance? entry)
    {
        TolerancePct = new FieldState(string.Empty, "Band, ±", "%", entry?.TolerancePct, optional: true);
        DcBiasFactor = new FieldState(string.Empty, "Left under DC bias", string.Empty, entry?.DcBiasFactor, "× C", optional: true);
    }

    /// <summary>tolerances.capacitors[k].tolerancePct; empty: tolerances.capacitancePct.</summary>
    public FieldState TolerancePct { get; }

    /// <summary>tolerances.capacitors[k].dcBiasFactor; empty: tolerances.dcBiasFactor.</summary>
    public FieldState DcBiasFactor { get; }

    /// <summary>True when either field holds a value: the branch has an entry of its own.</summary>
    public bool HasEntry => TolerancePct.Value is not null || DcBiasFactor.Value is not null;

    /// <summary>Renames the paths (the entry's index, or a placeholder of the branch when it has none).</summary>
    internal void SetPath(string prefix)
    {
        TolerancePct.Path = prefix + ".tolerancePct";
        DcBiasFactor.Path = prefix + ".dcBiasFactor";
    }
}
