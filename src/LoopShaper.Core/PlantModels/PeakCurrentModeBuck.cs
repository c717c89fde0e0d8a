using System.Globalization;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.PlantModels;

/// <summary>
/// Peak current-mode buck after R. B. Ridley, "A New, Continuous-Time Model for Current-Mode Control", IEEE Trans.
/// Power Electronics 6(2), 1991. The modulator sets d = Fm (vc - Ri He(s) iL + kf vg + kr v) with
/// Fm = 1 / (mc Sn Ts), mc = 1 + Se / Sn, the sampling gain He(s) = 1 + s / (wn Qz) + s^2 / wn^2, wn = pi / Ts,
/// Qz = -2 / pi, and for the buck kf = -(D Ts Ri / L)(1 - D/2), kr = Ts Ri / (2 L) (Ridley 1991, table of feedforward
/// gains, from memory; at DC they reduce to the more accurate model of Erickson and Maksimovic, 2nd ed., sec. 12.3).
/// With the averaged power stage L s iL = Ad d + Ag vg - Reff iL - Gv v, iL - iload = Y v (the same polynomials as the
/// voltage-mode model, <see cref="VoltageModeBuck"/>), and P = Den + Fm Ad (Ri He Ny - kr Dy), exactly (our algebra):
/// Gvc = Fm Ad Dy / P, Gvg = Dy (Ag + Fm Ad kf) / P, Zout = Dy (Zs + Fm Ad Ri He) / P,
/// and the inner current-loop gain Ti = Fm Ri He Gid, Gid = Ad Ny / Den.
/// A constant comparator or driver delay Td shifts the decision and the turn-off alike, so the period-to-period map of
/// a current perturbation, alpha = -(Sf - Se) / (Sn + Se) (Erickson and Maksimovic, 2nd ed., sec. 12.1), does not change:
/// the delay is kept out of the current loop and delays the control voltage, vout / vc = Gvc e^(-s Td) (our reasoning;
/// inside Ti, with the improper He(s), it would put spurious right-half-plane poles above fs).
/// In DCM the inductor current starts every period at zero, so d = vc / ((Sn + Se) Ts): no current feedback, no
/// sampling pole; kf = -D Ri Ts / L and kr = D Ri Ts / L (our linearisation) on the DCM model of <see cref="DcmBuck"/>.
/// </summary>
public static class PeakCurrentModeBuck
{
    private const string Ridley = "Ridley, IEEE Trans. Power Electronics 6(2), 1991";

    /// <summary>Qz of the sampling gain He(s): -2 / pi (Ridley 1991).</summary>
    public const double SamplingZeroQ = -2.0 / Math.PI;

    /// <summary>Qp = 1 / (pi (mc D' - 0.5)) (Ridley 1991); null when mc D' - 0.5 &lt;= 0 (unstable current loop).</summary>
    public static double? Qp(double mc, double dutyCycle)
    {
        double t = (mc * (1 - dutyCycle)) - 0.5;
        return t > 0 ? 1.0 / (Math.PI * t) : null;
    }

    /// <summary>The mc that gives a target Qp: mc = (1 / (pi Qp) + 0.5) / D' (Ridley's Qp solved for mc).</summary>
    public static double McForQp(double qp, double dutyCycle) => ((1.0 / (Math.PI * qp)) + 0.5) / (1 - dutyCycle);

    /// <summary>The transfer functions at an operating point (CCM or DCM, as the operating point was solved).</summary>
    public static BuckTransferFunctions TransferFunctions(BuckPowerStage stage, OperatingPoint op, PeakCurrentModeControl control)
    {
        bool dcm = op.RectifierConductionFraction is not null;
        double fs = stage.SwitchingFrequencyHz, ts = 1.0 / fs, l = stage.Inductor.InductanceH, ri = control.SenseGainOhm, d = op.DutyCycle;
        double sn = ri * op.OnIntervalInductorVoltageV / l;
        double sf = ri * op.OffIntervalInductorVoltageV / l;
        if (!(sn > 0) || !(sf > 0))
        {
            throw new InvalidOperationException($"The sensed slopes must be positive: Sn = {Format(sn, "V/s")}, Sf = {Format(sf, "V/s")} (check the input voltage, the losses and the sense gain).");
        }

        double se = control.Ramp.SlopeVPerS(sn, sf);
        double mc = 1 + (se / sn);
        double fm = 1.0 / (mc * sn * ts);
        double kf = dcm ? -d * ri * ts / l : -(d * ts * ri / l) * (1 - (d / 2));
        double kr = dcm ? d * ri * ts / l : ts * ri / (2 * l);
        double wn = Math.PI / ts;
        double damping = (mc * (1 - d)) - 0.5;
        double? qp = dcm ? null : Qp(mc, d);
        double mcUnity = McForQp(1.0, d);
        double seUnity = Math.Max(0.0, (mcUnity - 1) * sn);

        var model = dcm ? DcmBuck.Coefficients(stage, op) : new AveragedBuck(op.EffectiveInputVoltageV, d, op.SeriesResistanceOhm, 1.0);
        var parts = model.Build(stage, op.LoadResistanceOhm);
        double w = parts.W, ad = model.DutyGainV;

        // He(s) in x = s / w; in DCM the current term is absent.
        var he = new Polynomial([1.0, w / (wn * SamplingZeroQ), w * w / (wn * wn)]);
        var currentTerm = dcm ? new Polynomial([0.0]) : he.Multiply(parts.Ny).Scale(ri);

        double td = control.TotalDelayS(fs);
        var p = parts.Den.Add(currentTerm.Add(parts.Dy.Scale(-kr)).Scale(fm * ad));
        var gvc = TransferFunction.FromScaledPolynomials(fm * ad, parts.Dy, p, w, 0.0);
        var gvg = TransferFunction.FromScaledPolynomials(1.0, parts.Dy.Scale(model.LineGain + (fm * ad * kf)), p, w, 0.0);
        var zoutNum = dcm ? parts.Zs : parts.Zs.Add(he.Scale(fm * ad * ri));
        var zout = TransferFunction.FromScaledPolynomials(1.0, parts.Dy.Multiply(zoutNum), p, w, 0.0);
        TransferFunction? ti = dcm ? null : TransferFunction.FromScaledPolynomials(fm * ri * ad, he.Multiply(parts.Ny), parts.Den, w, 0.0);

        var figures = new PeakCurrentModeFigures(d, dcm, ri, sn, sf, se, mc, fm, kf, kr, wn / (2 * Math.PI), damping, qp, mcUnity, seUnity, td);
        var steps = Derivations(stage, op, control, figures, gvc).ToList();
        if (!dcm)
        {
            steps.Insert(0, Ccm(stage, op));
        }

        return new BuckTransferFunctions(gvc.WithDelay(td), gvg, zout, [.. steps], dcm ? SmallSignalModel.PeakCurrentModeDiscontinuous : SmallSignalModel.PeakCurrentModeContinuous, ti, figures);
    }

    private static Derivation Ccm(BuckPowerStage stage, OperatingPoint op)
        => new("Power stage (CCM)", "Gvd = Veff Dy / (Dy + (Rs + s L) Ny), Gid = Veff Ny / (Dy + (Rs + s L) Ny), Y = Ny / Dy",
            $"Veff = {Format(op.EffectiveInputVoltageV, "V")}, Rs = {Format(op.SeriesResistanceOhm, "Ohm")}, L = {Format(stage.Inductor.InductanceH, "H")}",
            "same polynomials as voltage mode", "Erickson & Maksimovic, 2nd ed., sec. 8.2 and 7.2");

    private static IEnumerable<Derivation> Derivations(BuckPowerStage stage, OperatingPoint op, PeakCurrentModeControl control, PeakCurrentModeFigures f, TransferFunction gvc)
    {
        var inv = CultureInfo.InvariantCulture;
        double l = stage.Inductor.InductanceH, ts = 1.0 / stage.SwitchingFrequencyHz, d = f.DutyCycle, ri = f.SenseGainOhm;
        string onV = f.IsDiscontinuous ? "Vin - Vout" : "Vin - Vout - I (Ron + DCR)";
        string offV = f.IsDiscontinuous ? "Vout + Vf" : "Vout + Vf + I (Rlow + DCR)";
        yield return new("Sensed on-time slope", $"Sn = Ri ({onV}) / L", $"Sn = {Format(ri, "Ohm")} x {Format(op.OnIntervalInductorVoltageV, "V")} / {Format(l, "H")}", Format(f.OnSlopeVPerS, "V/s"), Ridley + "; inductor voltages with losses after Erickson & Maksimovic, 2nd ed., ch. 3");
        yield return new("Sensed off-time slope", $"Sf = Ri ({offV}) / L", $"Sf = {Format(ri, "Ohm")} x {Format(op.OffIntervalInductorVoltageV, "V")} / {Format(l, "H")}", Format(f.OffSlopeVPerS, "V/s"), Ridley);
        string rampGiven = control.Ramp.Kind switch
        {
            CompensationRampKind.VoltsPerSecond => $"Se = {Format(control.Ramp.Value, "V/s")} (entered)",
            CompensationRampKind.MultipleOfOffSlope => string.Create(inv, $"Se = {control.Ramp.Value:G4} x Sf = {control.Ramp.Value:G4} x {Format(f.OffSlopeVPerS, "V/s")}"),
            _ => string.Create(inv, $"Se = (mc - 1) Sn = ({control.Ramp.Value:G4} - 1) x {Format(f.OnSlopeVPerS, "V/s")}"),
        };
        yield return new("External compensation ramp", "Se", rampGiven, Format(f.RampSlopeVPerS, "V/s"), Ridley);
        yield return new("Ramp factor", "mc = 1 + Se / Sn", $"mc = 1 + {Format(f.RampSlopeVPerS, "V/s")} / {Format(f.OnSlopeVPerS, "V/s")}", f.Mc.ToString("F4", inv), Ridley);
        yield return new("Modulator gain", "Fm = 1 / (mc Sn Ts)", string.Create(inv, $"Fm = 1 / ({f.Mc:F4} x {Format(f.OnSlopeVPerS, "V/s")} x {Format(ts, "s")})"), Format(f.ModulatorGainPerV, "1/V"), Ridley);
        if (f.IsDiscontinuous)
        {
            yield return new("DCM duty-cycle law", "d = vc / ((Sn + Se) Ts): kf = -D Ri Ts / L, kr = D Ri Ts / L, no current feedback",
                $"kf = -{d:F4} x {Format(ri, "Ohm")} x {Format(ts, "s")} / {Format(l, "H")}", string.Create(inv, $"kf = {f.FeedforwardGainKf:G4}, kr = {f.OutputFeedbackGainKr:G4}"), "peak-current law with a zero valley current; our linearisation");
        }
        else
        {
            yield return new("Sampling gain", "He(s) = 1 + s / (wn Qz) + s^2 / wn^2, wn = pi / Ts, Qz = -2 / pi", $"fn = fs / 2 = {Format(f.SamplingPoleHz, "Hz")}", string.Create(inv, $"Qz = {SamplingZeroQ:F4}"), Ridley);
            yield return new("Feedforward gain", "kf = -(D Ts Ri / L) (1 - D / 2)", $"kf = -({d:F4} x {Format(ts, "s")} x {Format(ri, "Ohm")} / {Format(l, "H")}) x (1 - {d:F4} / 2)", f.FeedforwardGainKf.ToString("G4", inv), Ridley + ", buck feedforward gains (from memory)");
            yield return new("Output feedback gain", "kr = Ts Ri / (2 L)", $"kr = {Format(ts, "s")} x {Format(ri, "Ohm")} / (2 x {Format(l, "H")})", f.OutputFeedbackGainKr.ToString("G4", inv), Ridley + ", buck feedforward gains (from memory)");
            yield return new("Sampling double-pole quality factor", "Qp = 1 / (pi (mc D' - 0.5))", string.Create(inv, $"Qp = 1 / (pi x ({f.Mc:F4} x {1 - d:F4} - 0.5))"),
                f.Qp is double q ? q.ToString("F3", inv) : string.Create(inv, $"none: mc D' - 0.5 = {f.DampingTerm:F4} <= 0, the current loop is unstable"), Ridley);
            yield return new("Ramp for Qp = 1", "mc = (1/pi + 0.5) / D', Se = (mc - 1) Sn", string.Create(inv, $"mc = (0.3183 + 0.5) / {1 - d:F4} = {f.SuggestedMcForUnityQp:F4}"),
                f.SuggestedRampForUnityQpVPerS > 0 ? Format(f.SuggestedRampForUnityQpVPerS, "V/s") : "no ramp needed (Qp < 1 without one)", "Ridley's Qp solved for mc; Qp = 1 is common practice, no source");
            if (op.LoadResistanceOhm is double r)
            {
                double t = (r * ts / l) * f.DampingTerm;
                double c = stage.TotalCapacitanceF;
                yield return new("Control-to-output DC gain (lossless closed form)", "Gvc0 = (R / Ri) / (1 + R Ts (mc D' - 0.5) / L)",
                    string.Create(inv, $"Gvc0 = ({Format(r, "Ohm")} / {Format(ri, "Ohm")}) / (1 + {t:G4})"), string.Create(inv, $"{r / ri / (1 + t):G4} V/V (exact model: {gvc.DcGain ?? 0:G4} V/V)"), Ridley);
                double wp = (1.0 / (c * r)) + (ts * f.DampingTerm / (l * c));
                yield return new("Load pole (closed form)", "wp = 1 / (C R) + Ts (mc D' - 0.5) / (L C)",
                    string.Create(inv, $"fp = (1 / ({Format(c, "F")} x {Format(r, "Ohm")}) + {Format(ts, "s")} x {f.DampingTerm:F4} / ({Format(l, "H")} x {Format(c, "F")})) / (2 pi)"), Format(wp / (2 * Math.PI), "Hz"), Ridley);
            }
        }

        if (f.DelayS > 0)
        {
            yield return new("Modulator delay", "vout / vc = Gvc e^(-s Td); the current loop's period-to-period map is unchanged by a constant delay",
                $"Td = {Format(f.DelayS, "s")}", Format(f.DelayS, "s"), "alpha = -(Sf - Se) / (Sn + Se), Erickson & Maksimovic, 2nd ed., sec. 12.1; our reasoning");
        }

        yield return new("Poles and zeros of Gvc (exact)", "roots of P(s), see the model", gvc.ToString(), $"{gvc.Poles.Length} poles, {gvc.Zeros.Length} zeros", Ridley + "; our algebra");
    }
}
