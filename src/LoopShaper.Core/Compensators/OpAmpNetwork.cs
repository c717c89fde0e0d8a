using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// The inverting voltage-feedback op-amp network, described by its parts. The input impedance is
/// Zin = R1 (the feedback divider's top resistor) in parallel with R3 + 1/(s C3) (Type III); the feedback impedance is
/// Zf = 1/(s C1) (Type I) or (R2 + 1/(s C1)) || 1/(s C2) (Type II and III). With an ideal amplifier Gc = Zf / Zin with
/// the inversion taken out:
/// Gc(s) = (1 + s R2 C1)(1 + s (R1 + R3) C3) / (s R1 (C1 + C2) (1 + s R2 C1 C2 / (C1 + C2)) (1 + s R3 C3))
/// (Venable 1983; Basso 2012, ch. 3). With an op-amp of open-loop gain A(s), the inverting node also sees the divider's
/// bottom resistor Rb; nodal analysis there (vn = -vo / A) gives exactly (our derivation)
/// Gc = (Zf / Zin) / (1 + (1 + Zf (1/Zin + 1/Rb)) / A(s)),
/// i.e. with Zf = Nf / Df, Zin = Ni / Di and 1/A = Pa / A0:
/// Gc = A0 Rb Nf Di / (A0 Rb Df Ni + Pa (Rb Df Ni + Rb Nf Di + Nf Ni)) (Rb absent: drop the Nf Ni term and Rb).
/// </summary>
/// <param name="Type">Compensator type.</param>
/// <param name="R1Ohm">Input resistor: the divider's top resistor, ohms.</param>
/// <param name="C1F">Feedback capacitor (in series with R2 for Type II and III), farads.</param>
/// <param name="R2Ohm">Feedback resistor in series with C1 (Type II and III), ohms.</param>
/// <param name="C2F">Feedback capacitor across R2 + C1 (Type II and III), farads.</param>
/// <param name="R3Ohm">Resistor in series with C3 across R1 (Type III), ohms.</param>
/// <param name="C3F">Capacitor in series with R3 across R1 (Type III), farads.</param>
/// <param name="RBottomOhm">The divider's bottom resistor, ohms (0: not given; the analysis then takes plant.feedback.bottomOhm). It sets the DC output voltage and, with a real amplifier, the noise gain.</param>
/// <param name="Amplifier">The op-amp: null or <see cref="IdealOpAmp"/> for an ideal one, or an <see cref="OpAmp"/>.</param>
public sealed record OpAmpNetwork(
    CompensatorType Type,
    double R1Ohm,
    double C1F,
    double R2Ohm = 0.0,
    double C2F = 0.0,
    double R3Ohm = 0.0,
    double C3F = 0.0,
    double RBottomOhm = 0.0,
    ErrorAmplifier? Amplifier = null) : Compensator(Type)
{
    /// <summary>The exact placement these parts give with an ideal amplifier (fi, zeros and poles in Hz).</summary>
    public CompensatorPlacement ToPlacement()
    {
        const double twoPi = 2 * Math.PI;
        return Type switch
        {
            CompensatorType.TypeI => new CompensatorPlacement(Type, new GainSetting(GainSettingKind.IntegratorHz, 1.0 / (twoPi * R1Ohm * C1F))),
            CompensatorType.TypeII => new CompensatorPlacement(
                Type,
                new GainSetting(GainSettingKind.IntegratorHz, 1.0 / (twoPi * R1Ohm * (C1F + C2F))),
                Zero1Hz: 1.0 / (twoPi * R2Ohm * C1F),
                Pole1Hz: (C1F + C2F) / (twoPi * R2Ohm * C1F * C2F)),
            _ => new CompensatorPlacement(
                Type,
                new GainSetting(GainSettingKind.IntegratorHz, 1.0 / (twoPi * R1Ohm * (C1F + C2F))),
                Zero1Hz: 1.0 / (twoPi * R2Ohm * C1F),
                Zero2Hz: 1.0 / (twoPi * (R1Ohm + R3Ohm) * C3F),
                Pole1Hz: (C1F + C2F) / (twoPi * R2Ohm * C1F * C2F),
                Pole2Hz: 1.0 / (twoPi * R3Ohm * C3F)),
        };
    }

    /// <inheritdoc />
    public override bool HasIdealAmplifier => Amplifier is not OpAmp;

    /// <inheritdoc />
    public override TransferFunction IdealTransferFunction(TransferFunction? restOfLoop = null) => ToPlacement().TransferFunction();

    /// <inheritdoc />
    public override TransferFunction TransferFunction(TransferFunction? restOfLoop = null)
        => Amplifier is OpAmp a ? WithAmplifier(a) : IdealTransferFunction();

    /// <summary>Zf = Nf / Df and Zin = Ni / Di as polynomials in s, ascending.</summary>
    internal (Polynomial Nf, Polynomial Df, Polynomial Ni, Polynomial Di) Impedances()
    {
        var (nf, df) = Type == CompensatorType.TypeI
            ? (Polynomial.One, new Polynomial([0.0, C1F]))
            : (new Polynomial([1.0, R2Ohm * C1F]), new Polynomial([0.0, C1F + C2F, R2Ohm * C1F * C2F]));
        var (ni, di) = Type == CompensatorType.TypeIII
            ? (new Polynomial([R1Ohm, R1Ohm * R3Ohm * C3F]), new Polynomial([1.0, (R1Ohm + R3Ohm) * C3F]))
            : (new Polynomial([R1Ohm]), Polynomial.One);
        return (nf, df, ni, di);
    }

    private TransferFunction WithAmplifier(OpAmp a)
    {
        var (nf, df, ni, di) = Impedances();
        var pa = new Polynomial([1.0, 1.0 / (2 * Math.PI * a.DominantPoleHz)]);
        if (a.SecondPoleHz is double f2)
        {
            pa = pa.Multiply(new Polynomial([1.0, 1.0 / (2 * Math.PI * f2)]));
        }

        double a0 = a.OpenLoopGain;
        Polynomial num, den;
        if (RBottomOhm > 0)
        {
            double rb = RBottomOhm;
            num = nf.Multiply(di).Scale(a0 * rb);
            den = df.Multiply(ni).Scale(a0 * rb).Add(pa.Multiply(df.Multiply(ni).Scale(rb).Add(nf.Multiply(di).Scale(rb)).Add(nf.Multiply(ni))));
        }
        else
        {
            num = nf.Multiply(di).Scale(a0);
            den = df.Multiply(ni).Scale(a0).Add(pa.Multiply(df.Multiply(ni).Add(nf.Multiply(di))));
        }

        return TransferFunctions.TransferFunction.FromCoefficients([.. num.Coefficients.Reverse()], [.. den.Coefficients.Reverse()]);
    }
}
