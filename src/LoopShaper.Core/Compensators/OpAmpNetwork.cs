using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Compensators;

/// <summary>
/// The inverting voltage-feedback op-amp network, ideal amplifier, described by its parts. The input impedance is
/// R1 (the feedback divider's top resistor) in parallel with R3 + 1/(s C3) (Type III); the feedback impedance is
/// 1/(s C1) (Type I) or (R2 + 1/(s C1)) || 1/(s C2) (Type II and III). Gc = Zf / Zin with the inversion taken out:
/// Gc(s) = (1 + s R2 C1)(1 + s (R1 + R3) C3) / (s R1 (C1 + C2) (1 + s R2 C1 C2 / (C1 + C2)) (1 + s R3 C3))
/// (Venable 1983; Basso 2012, ch. 3).
/// </summary>
/// <param name="Type">Compensator type.</param>
/// <param name="R1Ohm">Input resistor: the divider's top resistor, ohms.</param>
/// <param name="R2Ohm">Feedback resistor in series with C1 (Type II and III), ohms.</param>
/// <param name="R3Ohm">Resistor in series with C3 across R1 (Type III), ohms.</param>
/// <param name="C1F">Feedback capacitor (in series with R2 for Type II and III), farads.</param>
/// <param name="C2F">Feedback capacitor across R2 + C1 (Type II and III), farads.</param>
/// <param name="C3F">Capacitor in series with R3 across R1 (Type III), farads.</param>
/// <param name="RBottomOhm">The divider's bottom resistor, ohms: sets the DC output voltage only (ideal amplifier).</param>
public sealed record OpAmpNetwork(
    CompensatorType Type,
    double R1Ohm,
    double C1F,
    double R2Ohm = 0.0,
    double C2F = 0.0,
    double R3Ohm = 0.0,
    double C3F = 0.0,
    double RBottomOhm = 0.0) : Compensator(Type)
{
    /// <summary>The exact placement these parts give (fi, zeros and poles in Hz).</summary>
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
    public override TransferFunction TransferFunction(TransferFunction? restOfLoop = null) => ToPlacement().TransferFunction();
}
