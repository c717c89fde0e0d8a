namespace LoopShaper.Core.PlantModels;

/// <summary>
/// One kind of output capacitor, Count identical parts in parallel. The branch is Count x (C in series with ESR and ESL):
/// Z(s) = (1 + s ESR C + s^2 ESL C) / (s Count C) ... with ESR and ESL divided by Count.
/// </summary>
/// <param name="Label">What the engineer calls it ("ceramic 22u 0805", "polymer").</param>
/// <param name="Count">Number of parts in parallel, at least 1.</param>
/// <param name="CapacitanceF">Capacitance of one part, farads (after DC-bias derating, if the engineer applies it).</param>
/// <param name="EsrOhm">Equivalent series resistance of one part, ohms.</param>
/// <param name="EslH">Equivalent series inductance of one part, henries (0 to leave it out).</param>
public sealed record CapacitorBranch(string Label, int Count, double CapacitanceF, double EsrOhm, double EslH = 0.0)
{
    /// <summary>Total capacitance of the branch, farads.</summary>
    public double TotalCapacitanceF => Count * CapacitanceF;

    /// <summary>ESR of the paralleled parts, ohms.</summary>
    public double TotalEsrOhm => EsrOhm / Count;

    /// <summary>ESL of the paralleled parts, henries.</summary>
    public double TotalEslH => EslH / Count;

    /// <summary>The ESR zero of the branch, 1 / (2 pi ESR C), Hz; null when ESR is zero.</summary>
    public double? EsrZeroHz => EsrOhm > 0 ? 1.0 / (2 * Math.PI * EsrOhm * CapacitanceF) : null;
}
