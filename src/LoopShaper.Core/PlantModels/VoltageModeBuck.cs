using LoopShaper.Core.Derivations;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.PlantModels;

/// <summary>
/// Averaged small-signal model of the CCM buck with every parasitic (Erickson and Maksimovic, 2nd ed., sec. 7.2 and 8.2):
/// with Y(s) = 1/R + sum of the capacitor branch admittances s C / (1 + s ESR C + s^2 ESL C) and Zs = s L + Rs,
/// Gvd = Veff / (1 + Zs Y), Gvg = D / (1 + Zs Y), Zout = Zs / (1 + Zs Y).
/// </summary>
public static class VoltageModeBuck
{
    private const string Source = "Erickson & Maksimovic, 2nd ed., sec. 8.2 (buck Gvd, Gvg, Zout), with ESR, ESL, DCR and switch losses of sec. 7.2";

    /// <summary>The transfer functions at an operating point.</summary>
    public static BuckTransferFunctions TransferFunctions(BuckPowerStage stage, OperatingPoint op)
    {
        double l = stage.Inductor.InductanceH, c = stage.TotalCapacitanceF;
        double w = 1.0 / Math.Sqrt(l * c);
        var (ny, dy) = OutputAdmittance(stage, op.LoadResistanceOhm, w);

        // Zs = Rs + s L in x = s / w.
        var zs = new Polynomial([op.SeriesResistanceOhm, l * w]);
        var den = dy.Add(zs.Multiply(ny));
        var gvd = TransferFunction.FromScaledPolynomials(op.EffectiveInputVoltageV, dy, den, w, 0.0);
        var gvg = TransferFunction.FromScaledPolynomials(op.DutyCycle, dy, den, w, 0.0);
        var zout = TransferFunction.FromScaledPolynomials(1.0, zs.Multiply(dy), den, w, 0.0);

        double f0 = w / (2 * Math.PI);
        double? r = op.LoadResistanceOhm;
        double esrTotal = 1.0 / stage.OutputCapacitors.Where(b => b.EsrOhm > 0).Sum(b => 1.0 / b.TotalEsrOhm);
        var steps = new List<Derivation>
        {
            new("Output filter resonance", "f0 = 1 / (2 pi sqrt(L C))", $"f0 = 1 / (2 pi sqrt({Format(l, "H")} x {Format(c, "F")}))", Format(f0, "Hz"), "Erickson & Maksimovic, 2nd ed., sec. 8.2.1"),
            new("Control-to-output DC gain", "Gd0 = Veff R / (R + Rs)",
                r is double rr ? $"Gd0 = {Format(op.EffectiveInputVoltageV, "V")} x {Format(rr, "Ohm")} / ({Format(rr, "Ohm")} + {Format(op.SeriesResistanceOhm, "Ohm")})" : $"Gd0 = Veff at no load = {Format(op.EffectiveInputVoltageV, "V")}",
                Format(gvd.DcGain ?? 0, "V"), Source),
        };
        if (r is double rq)
        {
            double q = 1.0 / ((1.0 / rq * Math.Sqrt(l / c)) + ((op.SeriesResistanceOhm + (double.IsFinite(esrTotal) ? esrTotal : 0)) * Math.Sqrt(c / l)));
            steps.Add(new("Quality factor of the resonance (approximate)", "Q = 1 / (sqrt(L/C) / R + (Rs + ESR) sqrt(C/L))",
                $"Q = 1 / ({Format(Math.Sqrt(l / c), "Ohm")} / {Format(rq, "Ohm")} + ({Format(op.SeriesResistanceOhm, "Ohm")} + {Format(double.IsFinite(esrTotal) ? esrTotal : 0, "Ohm")}) / {Format(Math.Sqrt(l / c), "Ohm")})",
                $"{q:F3}", "Erickson & Maksimovic, 2nd ed., sec. 8.2.1 (low-Q approximation); exact poles below"));
        }

        foreach (var b in stage.OutputCapacitors.Where(b => b.EsrZeroHz is not null))
        {
            steps.Add(new($"ESR zero of '{b.Label}'", "fesr = 1 / (2 pi ESR C)", $"fesr = 1 / (2 pi x {Format(b.EsrOhm, "Ohm")} x {Format(b.CapacitanceF, "F")})", Format(b.EsrZeroHz!.Value, "Hz"), Source));
        }

        steps.Add(new("Poles and zeros of Gvd (exact)", "roots of Dy(s) and Dy(s) + (s L + Rs) Ny(s)", gvd.ToString(), $"{gvd.Poles.Length} poles, {gvd.Zeros.Length} zeros", Source));
        return new BuckTransferFunctions(gvd, gvg, zout, [.. steps]);
    }

    /// <summary>Y(s) = Ny / Dy in x = s / w: the load conductance plus every capacitor branch.</summary>
    internal static (Polynomial Ny, Polynomial Dy) OutputAdmittance(BuckPowerStage stage, double? loadOhm, double w)
    {
        var ny = new Polynomial([loadOhm is double r ? 1.0 / r : 0.0]);
        var dy = Polynomial.One;
        foreach (var b in stage.OutputCapacitors)
        {
            double cb = b.TotalCapacitanceF;
            var nb = new Polynomial([0.0, w * cb]);
            var db = new Polynomial([1.0, w * b.TotalEsrOhm * cb, w * w * b.TotalEslH * cb]);
            ny = ny.Multiply(db).Add(nb.Multiply(dy));
            dy = dy.Multiply(db);
        }

        return (ny, dy);
    }
}
