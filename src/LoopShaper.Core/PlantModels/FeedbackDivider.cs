namespace LoopShaper.Core.PlantModels;

/// <summary>The output voltage divider and the reference it is compared with: Vout = Vref (1 + Rtop / Rbottom).</summary>
/// <param name="TopOhm">Top resistor (output to feedback node), ohms: the op-amp network's R1.</param>
/// <param name="BottomOhm">Bottom resistor (feedback node to ground), ohms.</param>
/// <param name="ReferenceV">Reference voltage, V.</param>
public sealed record FeedbackDivider(double TopOhm, double BottomOhm, double ReferenceV)
{
    /// <summary>Hdiv = Rbottom / (Rtop + Rbottom).</summary>
    public double Ratio => BottomOhm / (TopOhm + BottomOhm);

    /// <summary>The output voltage this divider sets, V.</summary>
    public double OutputVoltageV => ReferenceV / Ratio;
}
