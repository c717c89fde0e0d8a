namespace LoopShaper.Core.Corners;

/// <summary>
/// The tolerance of one kind of output capacitor: the band of its capacitance and the fraction of it left under the
/// DC bias of the output (class II ceramics lose much of theirs; the datasheet's bias curve gives the figure).
/// </summary>
/// <param name="TolerancePct">Half-width of the capacitance band, % of the value, 0 to 90.</param>
/// <param name="DcBiasFactor">Fraction of the entered capacitance left at the output voltage, 0.05 to 1 (1: no derating). It applies at every corner and sample, nominal included.</param>
public sealed record CapacitorTolerance(double TolerancePct = 20.0, double DcBiasFactor = 1.0);
