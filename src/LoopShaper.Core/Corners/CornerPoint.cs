using LoopShaper.Core.Design;

namespace LoopShaper.Core.Corners;

/// <summary>One corner: an input-voltage corner, a load corner and a tolerance set.</summary>
/// <param name="Input">Input-voltage corner (min, nominal, max of plant.powerStage.inputVoltageV).</param>
/// <param name="Load">Load corner (min, nominal, max of plant.powerStage.loadCurrentA).</param>
/// <param name="Tolerances">Which extreme the toleranced parameters take.</param>
public sealed record CornerPoint(InputCorner Input, LoadCorner Load, ToleranceSet Tolerances)
{
    /// <summary>A short label: "Vin max, load min, all low".</summary>
    public string Label => $"Vin {Word(Input)}, load {Word(Load)}, {Word(Tolerances)}";

    private static string Word(InputCorner c) => c switch { InputCorner.Min => "min", InputCorner.Max => "max", _ => "nominal" };

    private static string Word(LoadCorner c) => c switch { LoadCorner.Min => "min", LoadCorner.Max => "max", _ => "nominal" };

    private static string Word(ToleranceSet t) => t switch
    {
        ToleranceSet.AllLow => "all low",
        ToleranceSet.AllHigh => "all high",
        ToleranceSet.WorstCase => "worst case",
        _ => "nominal parts",
    };
}
