using LoopShaper.Core.Compensators;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Part values of the inverting op-amp Type I, II and III networks (ideal amplifier) from a placement: the exact inverse
/// of <see cref="OpAmpNetwork.ToPlacement"/>, with R1 (the divider's top resistor) fixed by the user.
/// From fi = 1/(2 pi R1 (C1 + C2)), fz1 = 1/(2 pi R2 C1), fp1 = (C1 + C2)/(2 pi R2 C1 C2),
/// fz2 = 1/(2 pi (R1 + R3) C3), fp2 = 1/(2 pi R3 C3) (Venable 1983; Basso 2012, ch. 3):
/// C1 + C2 = 1/(2 pi R1 fi), C2 = (C1 + C2) fz1/fp1, C1 = (C1 + C2) - C2, R2 = 1/(2 pi fz1 C1),
/// R3 = R1 fz2/(fp2 - fz2) (from fp2/fz2 = (R1 + R3)/R3), C3 = 1/(2 pi R3 fp2).
/// </summary>
public static class OpAmpSynthesis
{
    /// <summary>Default R1: 10 kOhm (common practice, no source).</summary>
    public const double DefaultR1Ohm = 10e3;

    /// <summary>
    /// The network whose placement is exactly the given one. Zero1/Pole1 go to the feedback pair (R2, C1, C2) and
    /// Zero2/Pole2 to the input pair (R3, C3); when a pair would have its pole at or below its zero, the poles are
    /// swapped between the pairs (the transfer function is the same). Throws <see cref="ArgumentException"/> when no
    /// pairing works or a value is not finite and positive.
    /// </summary>
    /// <param name="placement">The placement; a crossover or mid-band gain needs <paramref name="restOfLoop"/>.</param>
    /// <param name="r1Ohm">R1, ohms.</param>
    /// <param name="restOfLoop">Fm Gvd, to resolve a gain given as a crossover target.</param>
    /// <param name="rBottomOhm">The divider's bottom resistor, ohms (DC only; 0 to leave it out).</param>
    public static OpAmpNetwork IdealNetwork(CompensatorPlacement placement, double r1Ohm, TransferFunction? restOfLoop = null, double rBottomOhm = 0.0)
    {
        if (!(r1Ohm > 0) || !double.IsFinite(r1Ohm))
        {
            throw new ArgumentOutOfRangeException(nameof(r1Ohm), r1Ohm, "R1 must be a finite positive resistance.");
        }

        double fi = placement.IntegratorHz(restOfLoop);
        if (!(fi > 0) || !double.IsFinite(fi))
        {
            throw new ArgumentException("The integrator frequency must be finite and positive.", nameof(placement));
        }

        double total = 1.0 / (2 * Math.PI * r1Ohm * fi);
        if (placement.Type == CompensatorType.TypeI)
        {
            return new OpAmpNetwork(CompensatorType.TypeI, r1Ohm, total, RBottomOhm: rBottomOhm);
        }

        double z1 = placement.Zero1Hz ?? double.NaN, p1 = placement.Pole1Hz ?? double.NaN;
        if (placement.Type == CompensatorType.TypeII)
        {
            Pair(z1, p1, "Type II");
            var (r2, c1, c2) = Feedback(total, z1, p1);
            return new OpAmpNetwork(CompensatorType.TypeII, r1Ohm, c1, r2, c2, RBottomOhm: rBottomOhm);
        }

        double z2 = placement.Zero2Hz ?? double.NaN, p2 = placement.Pole2Hz ?? double.NaN;
        if (!(p1 > z1 && p2 > z2) && p2 > z1 && p1 > z2)
        {
            (p1, p2) = (p2, p1);
        }

        Pair(z1, p1, "Type III (feedback pair)");
        Pair(z2, p2, "Type III (input pair)");
        var (r2b, c1b, c2b) = Feedback(total, z1, p1);
        double r3 = r1Ohm * z2 / (p2 - z2);
        double c3 = 1.0 / (2 * Math.PI * r3 * p2);
        return new OpAmpNetwork(CompensatorType.TypeIII, r1Ohm, c1b, r2b, c2b, r3, c3, rBottomOhm);
    }

    /// <summary>The divider's bottom resistor for an output voltage: Rbottom = R1 Vref / (Vout - Vref).</summary>
    public static double BottomResistorOhm(double r1Ohm, double outputVoltageV, double referenceV)
    {
        if (!(referenceV > 0) || !(outputVoltageV > referenceV) || !double.IsFinite(outputVoltageV))
        {
            throw new ArgumentOutOfRangeException(nameof(outputVoltageV), outputVoltageV, "The divider needs 0 < Vref < Vout.");
        }

        return r1Ohm * referenceV / (outputVoltageV - referenceV);
    }

    private static (double R2, double C1, double C2) Feedback(double total, double z, double p)
    {
        double c2 = total * z / p;
        double c1 = total - c2;
        return (1.0 / (2 * Math.PI * z * c1), c1, c2);
    }

    private static void Pair(double zero, double pole, string what)
    {
        if (!(zero > 0) || !double.IsFinite(zero) || !double.IsFinite(pole))
        {
            throw new ArgumentException($"{what}: the zero and pole must be finite positive frequencies.", nameof(zero));
        }

        if (!(pole > zero))
        {
            throw new ArgumentException($"{what}: an op-amp network puts each pole above its zero, but the zero is at {zero:G4} Hz and the pole at {pole:G4} Hz.", nameof(pole));
        }
    }
}
