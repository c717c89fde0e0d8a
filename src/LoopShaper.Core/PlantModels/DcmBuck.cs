using LoopShaper.Core.Derivations;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.PlantModels;

/// <summary>
/// Full-order averaged model of the buck in DCM (J. Sun, D. M. Mitchell, M. F. Greuel, P. T. Krein, R. M. Bass,
/// "Averaged Modeling of PWM Converters Operating in Discontinuous Conduction Mode", IEEE Trans. Power Electronics
/// 16(4), 2001): the inductor current stays a state, and the rectifier interval follows from it,
/// d2 = 2 L iL / (d Ts (vg - v)) - d. With the diode drop Vf in the off-interval,
/// L diL/dt = d (vg - v) - d2 (v + Vf) = d (vg + Vf) - 2 L iL (v + Vf) / (d Ts (vg - v)).
/// Linearised at the DCM operating point (our derivation, Q = D (Vin + Vf)):
/// Ad = 2 (Vin + Vf), Ag = D (1 + (Vin + Vf) / (Vin - Vout)), Reff = Q / I, Gv = Q (Vin + Vf) / ((Vout + Vf) (Vin - Vout)).
/// Letting L go to zero gives the reduced-order model of Erickson and Maksimovic, 2nd ed., sec. 11.3:
/// Gd0 = 2 V (1 - M) / (D (2 - M)), wp = (2 - M) / ((1 - M) R C). Conduction losses other than Vf are neglected.
/// </summary>
public static class DcmBuck
{
    private const string Source = "Sun et al., IEEE Trans. Power Electronics 16(4), 2001 (full-order DCM model), linearised: our derivation";

    /// <summary>The transfer functions at a DCM operating point.</summary>
    public static BuckTransferFunctions TransferFunctions(BuckPowerStage stage, OperatingPoint op)
    {
        var model = Coefficients(stage, op);
        var parts = model.Build(stage, op.LoadResistanceOhm);
        var gvd = parts.DutyToOutput;
        return new BuckTransferFunctions(gvd, parts.LineToOutput, parts.OutputImpedance, [.. Derivations(stage, op, model, gvd)], SmallSignalModel.VoltageModeDiscontinuous);
    }

    /// <summary>The linearised coefficients of the inductor equation at a DCM operating point.</summary>
    internal static AveragedBuck Coefficients(BuckPowerStage stage, OperatingPoint op)
    {
        if (op.RectifierConductionFraction is null || op.LoadResistanceOhm is null || !(op.Condition.LoadCurrentA > 0))
        {
            throw new InvalidOperationException("The DCM model needs an operating point in DCM with a load above zero (at no load the converter skips pulses).");
        }

        return Coefficients(stage, op.Condition, op.DutyCycle);
    }

    /// <summary>The DCM coefficients at a condition and DCM duty cycle (shared with the Monte Carlo fast path).</summary>
    internal static AveragedBuck Coefficients(BuckPowerStage stage, OperatingCondition at, double d)
    {
        double vg = at.InputVoltageV, v = stage.OutputVoltageV, vf = stage.Rectifier.ForwardDropV, i = at.LoadCurrentA;
        double q = d * (vg + vf);
        return new AveragedBuck(2 * (vg + vf), d * (1 + ((vg + vf) / (vg - v))), q / i, q * (vg + vf) / ((v + vf) * (vg - v)));
    }

    private static IEnumerable<Derivation> Derivations(BuckPowerStage stage, OperatingPoint op, AveragedBuck m, TransferFunctions.TransferFunction gvd)
    {
        double vg = op.Condition.InputVoltageV, v = stage.OutputVoltageV, vf = stage.Rectifier.ForwardDropV, i = op.Condition.LoadCurrentA, d = op.DutyCycle;
        double r = op.LoadResistanceOhm!.Value, l = stage.Inductor.InductanceH, c = stage.TotalCapacitanceF;
        double mRatio = v / vg;
        double gd0 = 2 * v * (1 - mRatio) / (d * (2 - mRatio));
        double fp = (2 - mRatio) / ((1 - mRatio) * r * c) / (2 * Math.PI);
        yield return new("DCM model: duty-cycle gain", "Ad = 2 (Vin + Vf)", $"Ad = 2 x ({Format(vg, "V")} + {Format(vf, "V")})", Format(m.DutyGainV, "V"), Source);
        yield return new("DCM model: line gain", "Ag = D (1 + (Vin + Vf) / (Vin - Vout))", $"Ag = {d:F4} x (1 + {Format(vg + vf, "V")} / {Format(vg - v, "V")})", $"{m.LineGain:F4}", Source);
        yield return new("DCM model: effective series resistance", "Reff = D (Vin + Vf) / I", $"Reff = {d:F4} x {Format(vg + vf, "V")} / {Format(i, "A")}", Format(m.SeriesResistanceOhm, "Ohm"), Source);
        yield return new("DCM model: output feedback gain", "Gv = D (Vin + Vf)^2 / ((Vout + Vf) (Vin - Vout))", $"Gv = {d:F4} x {Format(vg + vf, "V")}^2 / ({Format(v + vf, "V")} x {Format(vg - v, "V")})", $"{m.OutputGain:F4}", Source);
        yield return new("DCM high-frequency pole (estimate)", "fp2 = Reff / (2 pi L)", $"fp2 = {Format(m.SeriesResistanceOhm, "Ohm")} / (2 pi x {Format(l, "H")})", Format(m.SeriesResistanceOhm / (2 * Math.PI * l), "Hz"), Source + "; exact poles below");
        yield return new("Reduced-order DCM gain (lossless check)", "Gd0 = 2 Vout (1 - M) / (D (2 - M)), M = Vout / Vin",
            $"Gd0 = 2 x {Format(v, "V")} x (1 - {mRatio:F4}) / ({d:F4} x (2 - {mRatio:F4}))", Format(gd0, "V"), "Erickson & Maksimovic, 2nd ed., sec. 11.3");
        yield return new("Reduced-order DCM load pole (lossless check)", "fp = (2 - M) / (2 pi (1 - M) R C)",
            $"fp = (2 - {mRatio:F4}) / (2 pi x (1 - {mRatio:F4}) x {Format(r, "Ohm")} x {Format(c, "F")})", Format(fp, "Hz"), "Erickson & Maksimovic, 2nd ed., sec. 11.3");
        yield return new("Poles and zeros of Gvd in DCM (exact)", "roots of Dy(s) and (Reff + s L) Ny(s) + Gv Dy(s)", gvd.ToString(), $"{gvd.Poles.Length} poles, {gvd.Zeros.Length} zeros", Source);
    }
}
