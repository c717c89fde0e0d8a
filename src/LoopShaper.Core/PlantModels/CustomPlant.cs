using System.Collections.Immutable;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.PlantModels;

/// <summary>
/// A plant the built-in models do not cover (derived by hand, fitted elsewhere): control voltage to output voltage,
/// modulator included, as a rational function with an optional delay.
/// </summary>
/// <param name="Form">Coefficients or factors.</param>
/// <param name="NumeratorDescending">Numerator coefficients, descending powers of s (coefficient form).</param>
/// <param name="DenominatorDescending">Denominator coefficients, descending powers of s (coefficient form).</param>
/// <param name="Gain">Low-frequency gain coefficient K of K s^n prod(zeros)/prod(poles) (factor form).</param>
/// <param name="OriginOrder">n: zeros minus poles at the origin (factor form).</param>
/// <param name="Zeros">Zeros in Hz (factor form).</param>
/// <param name="Poles">Poles in Hz (factor form).</param>
/// <param name="DelayS">Pure delay, seconds.</param>
/// <param name="DividerRatio">Vref / Vout for the reference-to-output function (1 when unknown).</param>
/// <param name="SwitchingFrequencyHz">Switching frequency for the crossover criterion, Hz; null when there is none.</param>
public sealed record CustomPlant(
    CustomPlantForm Form,
    ImmutableArray<double> NumeratorDescending,
    ImmutableArray<double> DenominatorDescending,
    double Gain,
    int OriginOrder,
    ImmutableArray<Factor> Zeros,
    ImmutableArray<Factor> Poles,
    double DelayS = 0.0,
    double DividerRatio = 1.0,
    double? SwitchingFrequencyHz = null) : Plant
{
    /// <summary>The transfer function.</summary>
    public TransferFunction TransferFunction() => Form == CustomPlantForm.Coefficients
        ? TransferFunctions.TransferFunction.FromCoefficients(NumeratorDescending, DenominatorDescending, DelayS)
        : TransferFunctions.TransferFunction.FromFactors(Gain, OriginOrder, Zeros, Poles, DelayS);
}
