using System.Globalization;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// A compensator described by where its poles and zeros sit:
/// Gc(s) = (wi / s) (1 + s/wz1)(1 + s/wz2) / ((1 + s/wp1)(1 + s/wp2)); Type I uses none of the zeros and poles,
/// Type II z1 and p1, Type III all four (the usual integrator-plus-lead forms, Erickson and Maksimovic, 2nd ed., sec. 9.5).
/// </summary>
/// <param name="Type">Compensator type.</param>
/// <param name="Gain">How the gain is fixed.</param>
/// <param name="Zero1Hz">First zero, Hz (Type II and III).</param>
/// <param name="Zero2Hz">Second zero, Hz (Type III).</param>
/// <param name="Pole1Hz">First high-frequency pole, Hz (Type II and III).</param>
/// <param name="Pole2Hz">Second high-frequency pole, Hz (Type III).</param>
public sealed record CompensatorPlacement(
    CompensatorType Type,
    GainSetting Gain,
    double? Zero1Hz = null,
    double? Zero2Hz = null,
    double? Pole1Hz = null,
    double? Pole2Hz = null) : Compensator(Type)
{
    /// <summary>The zeros in Hz that this type uses.</summary>
    public IReadOnlyList<double> ZerosHz => Type switch
    {
        CompensatorType.TypeI => [],
        CompensatorType.TypeII => [Zero1Hz ?? double.NaN],
        _ => [Zero1Hz ?? double.NaN, Zero2Hz ?? double.NaN],
    };

    /// <summary>The non-origin poles in Hz that this type uses.</summary>
    public IReadOnlyList<double> PolesHz => Type switch
    {
        CompensatorType.TypeI => [],
        CompensatorType.TypeII => [Pole1Hz ?? double.NaN],
        _ => [Pole1Hz ?? double.NaN, Pole2Hz ?? double.NaN],
    };

    /// <summary>The shape with wi = 1 rad/s.</summary>
    public TransferFunction UnitShape()
        => TransferFunctions.TransferFunction.FromFactors(1.0, -1, ZerosHz.Select(z => Factor.Real(z)), PolesHz.Select(p => Factor.Real(p)));

    /// <summary>The integrator's unity-gain frequency fi = wi / (2 pi) in Hz, given the rest of the loop when the gain is a crossover target.</summary>
    public double IntegratorHz(TransferFunction? restOfLoop = null)
    {
        switch (Gain.Kind)
        {
            case GainSettingKind.IntegratorHz:
                return Gain.Value;
            case GainSettingKind.MidbandGainDb:
                if (Type == CompensatorType.TypeI)
                {
                    throw new InvalidOperationException("A Type I compensator has no mid-band gain; set its integrator frequency or a crossover target.");
                }

                return Math.Pow(10, Gain.Value / 20.0) * (Zero1Hz ?? double.NaN);
            default:
                if (restOfLoop is null)
                {
                    throw new InvalidOperationException("A crossover target needs the rest of the loop to fix the gain.");
                }

                // |T(j wc)| = wi |shape(j wc)| |rest(j wc)| = 1.
                double fc = Gain.Value;
                double m = Math.Exp(UnitShape().LogMagnitude(2 * Math.PI * fc) + restOfLoop.LogMagnitude(2 * Math.PI * fc));
                return 1.0 / m / (2 * Math.PI);
        }
    }

    /// <inheritdoc />
    public override TransferFunction TransferFunction(TransferFunction? restOfLoop = null)
        => UnitShape().Scale(2 * Math.PI * IntegratorHz(restOfLoop));

    /// <summary>A one-line description.</summary>
    public override string ToString()
        => string.Create(CultureInfo.InvariantCulture, $"{Type} {Gain.Kind}={Gain.Value:G4}, zeros {string.Join("/", ZerosHz.Select(z => z.ToString("G4", CultureInfo.InvariantCulture)))} Hz, poles {string.Join("/", PolesHz.Select(p => p.ToString("G4", CultureInfo.InvariantCulture)))} Hz");
}
