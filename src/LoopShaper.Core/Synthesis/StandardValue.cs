using System.Globalization;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>An ideal value and the preferred value of a series it snaps to.</summary>
/// <param name="IdealValue">The value asked for (ohms, farads, any positive quantity).</param>
/// <param name="Value">The nearest preferred value, same unit.</param>
/// <param name="Series">The series it comes from.</param>
/// <param name="Index">Position on the whole ladder of the series: decade x count + position in the decade (1.0 of 10^0 is 0).</param>
public sealed record StandardValue(double IdealValue, double Value, ESeries Series, int Index)
{
    /// <summary>Error of the preferred value against the ideal one, 100 (value - ideal) / ideal, in %.</summary>
    public double ErrorPct => 100.0 * (Value - IdealValue) / IdealValue;

    /// <summary>"4.7 nF (E12, ideal 4.53 nF, +3.7 %)".</summary>
    public string Describe(string unit)
        => string.Create(CultureInfo.InvariantCulture, $"{Format(Value, unit)} ({Series}, ideal {Format(IdealValue, unit)}, {ErrorPct:+0.00;-0.00;0.00} %)");
}
