using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// A transconductance (OTA) compensator: the divider Hdiv = Rbottom / (Rtop + Rbottom) ahead of the amplifier (the
/// loop's sense gain), the amplifier's current gm (vref - vfb) into its output resistance Ro in parallel with the network
/// to ground: C1 (Type I) or R2 + C1 in parallel with C2 (Type II). With the inversion taken out,
/// Gc(s) = gm (Ro || Zn(s)), Zn = (1 + s R2 C1) / (s (C1 + C2) (1 + s R2 C1 C2 / (C1 + C2))), so
/// Gc = gm Ro Nn / (Ro Dn + Nn) with Zn = Nn / Dn (Basso 2012, ch. 3, OTA compensators; multiplied out here).
/// With Ro infinite: fi = gm / (2 pi (C1 + C2)), fz = 1 / (2 pi R2 C1), fp = (C1 + C2) / (2 pi R2 C1 C2).
/// </summary>
/// <param name="Type">Type I or Type II.</param>
/// <param name="Amplifier">The transconductance amplifier.</param>
/// <param name="C1F">Capacitor to ground (in series with R2 for Type II), farads.</param>
/// <param name="R2Ohm">Resistor in series with C1 (Type II), ohms.</param>
/// <param name="C2F">Capacitor from the output to ground across R2 + C1 (Type II), farads.</param>
public sealed record TransconductanceNetwork(CompensatorType Type, Transconductance Amplifier, double C1F, double R2Ohm = 0.0, double C2F = 0.0) : Compensator(Type)
{
    /// <inheritdoc />
    public override bool HasIdealAmplifier => false;

    /// <inheritdoc />
    public override bool TakesDividedOutput => true;

    /// <summary>The placement with an infinite output resistance (gm into the network alone).</summary>
    public CompensatorPlacement ToPlacement()
    {
        const double twoPi = 2 * Math.PI;
        double gm = Amplifier.TransconductanceS;
        return Type switch
        {
            CompensatorType.TypeI => new CompensatorPlacement(Type, new GainSetting(GainSettingKind.IntegratorHz, gm / (twoPi * C1F))),
            CompensatorType.TypeII => new CompensatorPlacement(
                Type,
                new GainSetting(GainSettingKind.IntegratorHz, gm / (twoPi * (C1F + C2F))),
                Zero1Hz: 1.0 / (twoPi * R2Ohm * C1F),
                Pole1Hz: (C1F + C2F) / (twoPi * R2Ohm * C1F * C2F)),
            _ => throw new InvalidOperationException("A transconductance compensator is Type I or Type II here."),
        };
    }

    /// <inheritdoc />
    public override TransferFunction IdealTransferFunction(TransferFunction? restOfLoop = null) => ToPlacement().TransferFunction();

    /// <inheritdoc />
    public override TransferFunction TransferFunction(TransferFunction? restOfLoop = null)
    {
        _ = ToPlacement();
        var (nn, dn) = Type == CompensatorType.TypeI
            ? (Polynomial.One, new Polynomial([0.0, C1F]))
            : (new Polynomial([1.0, R2Ohm * C1F]), new Polynomial([0.0, C1F + C2F, R2Ohm * C1F * C2F]));
        double gm = Amplifier.TransconductanceS, ro = Amplifier.OutputResistanceOhm;
        var num = nn.Scale(gm * ro);
        var den = dn.Scale(ro).Add(nn);
        return TransferFunctions.TransferFunction.FromCoefficients([.. num.Coefficients.Reverse()], [.. den.Coefficients.Reverse()]);
    }
}
