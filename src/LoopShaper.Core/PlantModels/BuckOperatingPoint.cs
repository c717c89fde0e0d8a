using System.Numerics;
using LoopShaper.Core.Derivations;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.PlantModels;

/// <summary>Steady state of the averaged buck with conduction losses (Erickson and Maksimovic, 2nd ed., ch. 3 and sec. 7.2).</summary>
public static class BuckOperatingPoint
{
    private const string SourceLosses = "Erickson & Maksimovic, 2nd ed., ch. 3 (inductor volt-second balance with conduction losses)";

    /// <summary>
    /// Solves volt-second balance on the inductor:
    /// D (Vin - I Ron) - D' (Vf + I Rlow) - I DCR = Vout, so D = (Vout + Vf + I (DCR + Rlow)) / (Vin + Vf - I (Ron - Rlow)).
    /// </summary>
    public static OperatingPoint Solve(BuckPowerStage stage, OperatingCondition at)
    {
        double vin = at.InputVoltageV, vout = stage.OutputVoltageV, i = at.LoadCurrentA;
        double ron = stage.HighSideOnResistanceOhm, rlow = stage.Rectifier.OnResistanceOhm, vf = stage.Rectifier.ForwardDropV;
        double dcr = stage.Inductor.DcrOhm, l = stage.Inductor.InductanceH, fs = stage.SwitchingFrequencyHz;
        double veff = vin + vf - (i * (ron - rlow));
        double d = (vout + vf + (i * (dcr + rlow))) / veff;
        double dIdeal = vout / vin;
        double dp = 1 - d;
        double rs = (d * ron) + (dp * rlow) + dcr;

        // Off-interval inductor voltage: Vout + Vf + I (Rlow + DCR), for D' Ts.
        double vOff = vout + vf + (i * (rlow + dcr));
        double ripple = vOff * dp / (l * fs);
        double? rLoad = i > 0 ? vout / i : null;
        double boundary = ripple / 2;
        var mode = stage.Rectifier.Kind == RectifierKind.Diode && i < boundary ? ConductionMode.Discontinuous : ConductionMode.Continuous;
        double vRipple = OutputRipple(stage, d, ripple, rLoad);

        var steps = new List<Derivation>
        {
            new("Ideal duty cycle", "D0 = Vout / Vin", $"D0 = {Format(vout, "V")} / {Format(vin, "V")}", $"{dIdeal:F4}", "common practice, no source"),
            new("Duty cycle with losses", "D = (Vout + Vf + I (DCR + Rlow)) / (Vin + Vf - I (Ron - Rlow))",
                $"D = ({Format(vout, "V")} + {Format(vf, "V")} + {Format(i, "A")} x ({Format(dcr, "Ohm")} + {Format(rlow, "Ohm")})) / ({Format(vin, "V")} + {Format(vf, "V")} - {Format(i, "A")} x ({Format(ron, "Ohm")} - {Format(rlow, "Ohm")}))",
                $"{d:F4}", SourceLosses),
            new("Inductor ripple current", "dI = (Vout + Vf + I (Rlow + DCR)) D' / (L fs)",
                $"dI = {Format(vOff, "V")} x {dp:F4} / ({Format(l, "H")} x {Format(fs, "Hz")})", Format(ripple, "A") + " pk-pk", "Erickson & Maksimovic, 2nd ed., sec. 2.3 (inductor current ripple)"),
            new("Peak inductor current", "Ipk = I + dI / 2", $"Ipk = {Format(i, "A")} + {Format(ripple, "A")} / 2", Format(i + (ripple / 2), "A"), "common practice, no source"),
            new("CCM/DCM boundary load", "Ibound = dI / 2 (K = 2L / (R Ts) = 1 - D at the boundary)", $"Ibound = {Format(ripple, "A")} / 2", Format(boundary, "A"), "Erickson & Maksimovic, 2nd ed., sec. 5.1"),
            new("Modulating voltage", "Veff = Vin + Vf - I (Ron - Rlow)", $"Veff = {Format(vin, "V")} + {Format(vf, "V")} - {Format(i, "A")} x ({Format(ron, "Ohm")} - {Format(rlow, "Ohm")})", Format(veff, "V"), "Erickson & Maksimovic, 2nd ed., sec. 7.2 (averaged small-signal model with losses)"),
            new("Average series resistance", "Rs = D Ron + D' Rlow + DCR", $"Rs = {d:F4} x {Format(ron, "Ohm")} + {dp:F4} x {Format(rlow, "Ohm")} + {Format(dcr, "Ohm")}", Format(rs, "Ohm"), "Erickson & Maksimovic, 2nd ed., sec. 7.2"),
            new("Output ripple voltage", "dV = pk-pk of the triangular ripple current through Zc || R (48 harmonics)", $"dI = {Format(ripple, "A")}, fs = {Format(fs, "Hz")}", Format(vRipple, "V") + " pk-pk", "Fourier series of the inductor ripple; common practice, no source"),
        };

        return new OperatingPoint(at, d, dIdeal, rLoad, ripple, i + (ripple / 2), i - (ripple / 2), vRipple, mode, boundary, veff, rs, [.. steps]);
    }

    /// <summary>Peak-to-peak of the triangular inductor ripple (rising for D Ts) driven through the output bank in parallel with the load.</summary>
    public static double OutputRipple(BuckPowerStage stage, double d, double rippleApp, double? rLoad)
    {
        const int harmonics = 48, samples = 128;
        double w = 2 * Math.PI * stage.SwitchingFrequencyHz;
        d = Math.Clamp(d, 1e-3, 1 - 1e-3);
        var v = new double[samples];
        for (int k = 1; k <= harmonics; k++)
        {
            // Complex Fourier coefficient of a zero-mean triangle of peak-to-peak A rising over D T:
            // c_k = A (e^{-j 2 pi k D} - 1) / (4 pi^2 k^2 D (1 - D)) (direct integration, our derivation).
            double x = 2 * Math.PI * k * d;
            var ck = rippleApp * (new Complex(Math.Cos(x), -Math.Sin(x)) - 1) / (4 * Math.PI * Math.PI * k * k * d * (1 - d));
            var y = new Complex(rLoad is double r ? 1.0 / r : 0.0, 0);
            var s = new Complex(0, k * w);
            foreach (var b in stage.OutputCapacitors)
            {
                y += s * b.TotalCapacitanceF / (1 + (s * b.TotalEsrOhm * b.TotalCapacitanceF) + (s * s * b.TotalEslH * b.TotalCapacitanceF));
            }

            var vk = 2.0 * ck / y;
            var step = new Complex(Math.Cos(2 * Math.PI * k / samples), Math.Sin(2 * Math.PI * k / samples));
            var rot = Complex.One;
            for (int n = 0; n < samples; n++)
            {
                // Re(vk e^{j 2 pi k n / N}) by a rotating phasor.
                v[n] += (vk * rot).Real;
                rot *= step;
            }
        }

        return v.Max() - v.Min();
    }
}
