namespace LoopShaper.Library.Comparison;

/// <summary>One computed figure of two designs side by side.</summary>
/// <param name="Name">What it is ("phase margin").</param>
/// <param name="Unit">Its unit ("deg", "Hz"; empty for a yes/no figure).</param>
/// <param name="A">Its value for design A; null where A has none (no crossover in range, no load step, input errors).</param>
/// <param name="B">Its value for design B.</param>
/// <param name="TextA">A's value as shown: engineering notation with three significant digits, "yes"/"no", or "none".</param>
/// <param name="TextB">B's value as shown.</param>
public sealed record ResultFigure(string Name, string Unit, double? A, double? B, string TextA, string TextB)
{
    /// <summary>True when the two values differ (exactly: the analysis is deterministic, so equal inputs give equal bits).</summary>
    public bool Differs => A != B;
}
