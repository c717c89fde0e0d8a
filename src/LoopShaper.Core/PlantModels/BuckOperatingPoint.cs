using System.Numerics;
using LoopShaper.Core.Derivations;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.PlantModels;

/// <summary>Steady state of the averaged buck with conduction losses (Erickson and Maksimovic, 2nd ed., ch. 3 and sec. 7.2).</summary>
public static class BuckOperatingPoint
{
    private const string SourceLosses = "Erickson & Maksimovic, 2nd ed., ch. 3 (inductor volt-second balance with conduction losses)";

    private const string SourceDcm = "Erickson & Maksimovic, 2nd ed., sec. 5.2 (buck in DCM: volt-second balance with the idle interval)";

    /// <summary>
    /// The steady state at one condition: CCM volt-second balance, or, when a diode rectifier stops conducting below the
    /// boundary load (K = 2L/(R Ts) &lt; Kcrit = 1 - D, Erickson and Maksimovic, 2nd ed., sec. 5.1), the DCM solution.
    /// </summary>
    public static OperatingPoint Solve(BuckPowerStage stage, OperatingCondition at)
    {
        var ccm = SolveContinuous(stage, at);
        return ccm.Mode == ConductionMode.Discontinuous && at.LoadCurrentA > 0 ? SolveDiscontinuous(stage, at, ccm) : ccm;
    }

    /// <summary>
    /// CCM volt-second balance on the inductor (the mode reported is still the physical one):
    /// D (Vin - I Ron) - D' (Vf + I Rlow) - I DCR = Vout, so D = (Vout + Vf + I (DCR + Rlow)) / (Vin + Vf - I (Ron - Rlow)).
    /// </summary>
    public static OperatingPoint SolveContinuous(BuckPowerStage stage, OperatingCondition at)
    {
        double vin = at.InputVoltageV, vout = stage.OutputVoltageV, i = at.LoadCurrentA;
        double ron = stage.HighSideOnResistanceOhm, rlow = stage.Rectifier.OnResistanceOhm, vf = stage.Rectifier.ForwardDropV;
        double dcr = stage.Inductor.DcrOhm, l = stage.Inductor.InductanceH, fs = stage.SwitchingFrequencyHz;
        var (d, veff, rs, vOn, vOff, ripple, dcm) = Balance(stage, at);
        double dIdeal = vout / vin;
        double dp = 1 - d;
        double? rLoad = i > 0 ? vout / i : null;
        double boundary = ripple / 2;
        var mode = dcm ? ConductionMode.Discontinuous : ConductionMode.Continuous;
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

        return new OperatingPoint(at, d, dIdeal, rLoad, ripple, i + (ripple / 2), i - (ripple / 2), vRipple, mode, boundary, veff, rs, [.. steps])
        {
            OnIntervalInductorVoltageV = vOn,
            OffIntervalInductorVoltageV = vOff,
        };
    }

    /// <summary>
    /// The CCM volt-second balance alone (no derivations, no ripple voltage), shared with the Monte Carlo fast path:
    /// D, Veff = Vin + Vf - I (Ron - Rlow), Rs = D Ron + D' Rlow + DCR, the on- and off-interval inductor voltages
    /// Vin - Vout - I (Ron + DCR) and Vout + Vf + I (Rlow + DCR), the ripple current and whether a diode rectifier is in DCM.
    /// </summary>
    internal static (double DutyCycle, double EffectiveInputVoltageV, double SeriesResistanceOhm, double OnV, double OffV, double RippleA, bool Discontinuous) Balance(BuckPowerStage stage, OperatingCondition at)
    {
        double vin = at.InputVoltageV, vout = stage.OutputVoltageV, i = at.LoadCurrentA;
        double ron = stage.HighSideOnResistanceOhm, rlow = stage.Rectifier.OnResistanceOhm, vf = stage.Rectifier.ForwardDropV;
        double dcr = stage.Inductor.DcrOhm, l = stage.Inductor.InductanceH, fs = stage.SwitchingFrequencyHz;
        double veff = vin + vf - (i * (ron - rlow));
        double d = (vout + vf + (i * (dcr + rlow))) / veff;
        double dp = 1 - d;
        double rs = (d * ron) + (dp * rlow) + dcr;
        double vOff = vout + vf + (i * (rlow + dcr));
        double vOn = vin - vout - (i * (ron + dcr));
        double ripple = vOff * dp / (l * fs);
        return (d, veff, rs, vOn, vOff, ripple, stage.Rectifier.Kind == RectifierKind.Diode && i < ripple / 2);
    }

    /// <summary>The DCM duty cycle D = sqrt(2 L I (Vout + Vf) / (Ts (Vin - Vout) (Vin + Vf))) (see <see cref="SolveDiscontinuous"/>).</summary>
    internal static double DiscontinuousDutyCycle(BuckPowerStage stage, OperatingCondition at)
    {
        double vin = at.InputVoltageV, vout = stage.OutputVoltageV, vf = stage.Rectifier.ForwardDropV;
        return Math.Sqrt(2 * stage.Inductor.InductanceH * at.LoadCurrentA * (vout + vf) * stage.SwitchingFrequencyHz / ((vin - vout) * (vin + vf)));
    }

    /// <summary>
    /// The DCM steady state of a diode rectifier, conduction losses neglected apart from the diode drop (at loads below
    /// the boundary the I R drops are small beside Vout). Volt-second balance D (Vin - Vout) = D2 (Vout + Vf) and the
    /// load current I = Ipk (D + D2) / 2 with Ipk = (Vin - Vout) D Ts / L give
    /// D = sqrt(2 L I (Vout + Vf) / (Ts (Vin - Vout) (Vin + Vf))); with Vf = 0 this is M = 2 / (1 + sqrt(1 + 4K / D^2)),
    /// K = 2L / (R Ts) (Erickson and Maksimovic, 2nd ed., sec. 5.2).
    /// </summary>
    private static OperatingPoint SolveDiscontinuous(BuckPowerStage stage, OperatingCondition at, OperatingPoint ccm)
    {
        double vin = at.InputVoltageV, vout = stage.OutputVoltageV, i = at.LoadCurrentA, vf = stage.Rectifier.ForwardDropV;
        double l = stage.Inductor.InductanceH, fs = stage.SwitchingFrequencyHz, ts = 1.0 / fs;
        double vOn = vin - vout, vOff = vout + vf;
        double d = DiscontinuousDutyCycle(stage, at);
        double d2 = d * vOn / vOff;
        double ipk = vOn * d * ts / l;
        double r = vout / i;
        double k = 2 * l / (r * ts);
        double mLossless = 2.0 / (1.0 + Math.Sqrt(1.0 + (4.0 * k / (d * d))));
        double vRipple = OutputRipple(stage, d, d2, ipk, r);

        var steps = new List<Derivation>(ccm.Derivations.Take(2))
        {
            new("Conduction mode", "DCM when K = 2L / (R Ts) < Kcrit = 1 - D (diode rectifier)",
                $"K = 2 x {Format(l, "H")} / ({Format(r, "Ohm")} x {Format(ts, "s")}) = {k:F4}, Kcrit = 1 - {ccm.DutyCycle:F4} = {1 - ccm.DutyCycle:F4}",
                $"DCM below {Format(ccm.BoundaryLoadCurrentA, "A")}", "Erickson & Maksimovic, 2nd ed., sec. 5.1"),
            new("DCM duty cycle", "D = sqrt(2 L I (Vout + Vf) / (Ts (Vin - Vout) (Vin + Vf)))",
                $"D = sqrt(2 x {Format(l, "H")} x {Format(i, "A")} x {Format(vOff, "V")} / ({Format(ts, "s")} x {Format(vOn, "V")} x {Format(vin + vf, "V")}))",
                $"{d:F4}", SourceDcm + "; conduction losses other than Vf neglected"),
            new("Rectifier conduction interval", "D2 = D (Vin - Vout) / (Vout + Vf)", $"D2 = {d:F4} x {Format(vOn, "V")} / {Format(vOff, "V")}", $"{d2:F4}", SourceDcm),
            new("Peak inductor current", "Ipk = (Vin - Vout) D Ts / L", $"Ipk = {Format(vOn, "V")} x {d:F4} x {Format(ts, "s")} / {Format(l, "H")}", Format(ipk, "A"), SourceDcm),
            new("Conversion ratio without the diode drop (check)", "M = 2 / (1 + sqrt(1 + 4K / D^2))", $"M = 2 / (1 + sqrt(1 + 4 x {k:F4} / {d:F4}^2))", $"{mLossless:F4} (Vout / Vin = {vout / vin:F4})", "Erickson & Maksimovic, 2nd ed., sec. 5.2"),
            new("Output ripple voltage", "dV = pk-pk of the DCM current pulse (rise D, fall D2) through Zc || R (48 harmonics)", $"Ipk = {Format(ipk, "A")}, fs = {Format(fs, "Hz")}", Format(vRipple, "V") + " pk-pk", "Fourier series of the inductor current; common practice, no source"),
        };
        steps.AddRange(ccm.Derivations.Skip(5).Take(2));

        return ccm with
        {
            DutyCycle = d,
            RippleCurrentApp = ipk,
            PeakInductorCurrentA = ipk,
            ValleyInductorCurrentA = 0.0,
            OutputRippleVpp = vRipple,
            Derivations = [.. steps],
            ContinuousDutyCycle = ccm.DutyCycle,
            RectifierConductionFraction = d2,
            OnIntervalInductorVoltageV = vOn,
            OffIntervalInductorVoltageV = vOff,
        };
    }

    /// <summary>Peak-to-peak of the triangular inductor ripple (rising for D Ts) driven through the output bank in parallel with the load.</summary>
    public static double OutputRipple(BuckPowerStage stage, double d, double rippleApp, double? rLoad)
        => OutputRipple(stage, Math.Clamp(d, 1e-3, 1 - 1e-3), 1 - Math.Clamp(d, 1e-3, 1 - 1e-3), rippleApp, rLoad);

    /// <summary>
    /// Peak-to-peak output ripple for an inductor current that rises for a Ts and falls for b Ts (a + b = 1 in CCM,
    /// a + b &lt; 1 with an idle interval in DCM), driven through the output bank in parallel with the load.
    /// </summary>
    internal static double OutputRipple(BuckPowerStage stage, double a, double b, double rippleApp, double? rLoad)
    {
        const int harmonics = 48, samples = 128;
        double w = 2 * Math.PI * stage.SwitchingFrequencyHz;
        var v = new double[samples];
        for (int k = 1; k <= harmonics; k++)
        {
            // Complex Fourier coefficient of a triangle of height A rising over a T and falling over b T, from the jumps
            // of its second derivative: c_k = -A / (4 pi^2 k^2) (1/a - (1/a + 1/b) e^{-j 2 pi k a} + (1/b) e^{-j 2 pi k (a + b)})
            // (direct integration, our derivation; for a + b = 1 it is A (e^{-j 2 pi k a} - 1) / (4 pi^2 k^2 a (1 - a))).
            var e1 = Complex.FromPolarCoordinates(1.0, -2 * Math.PI * k * a);
            var e2 = Complex.FromPolarCoordinates(1.0, -2 * Math.PI * k * (a + b));
            var ck = -rippleApp / (4 * Math.PI * Math.PI * k * k) * ((1.0 / a) - (((1.0 / a) + (1.0 / b)) * e1) + (e2 / b));
            var y = new Complex(rLoad is double r ? 1.0 / r : 0.0, 0);
            var s = new Complex(0, k * w);
            foreach (var br in stage.OutputCapacitors)
            {
                y += s * br.TotalCapacitanceF / (1 + (s * br.TotalEsrOhm * br.TotalCapacitanceF) + (s * s * br.TotalEslH * br.TotalCapacitanceF));
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
