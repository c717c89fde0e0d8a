using LoopShaper.Core.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.PlantModels;

/// <summary>
/// The averaged buck in one form for both conduction modes: the inductor equation
/// L s iL = Ad d + Ag vg - Reff iL - Gv v, and the output node iL - iload = Y(s) v with Y = Ny / Dy (load conductance
/// plus every capacitor branch). CCM (Erickson and Maksimovic, 2nd ed., sec. 7.2): Ad = Veff, Ag = D, Reff = Rs, Gv = 1.
/// DCM: the linearised full-order model of Sun et al. 2001 (see <see cref="DcmBuck"/>).
/// All polynomials are in the scaled variable x = s / w, w = 1 / sqrt(L C).
/// </summary>
/// <param name="DutyGainV">Ad: inductor voltage per unit duty cycle, V.</param>
/// <param name="LineGain">Ag: inductor voltage per volt of input, V/V.</param>
/// <param name="SeriesResistanceOhm">Reff: effective series resistance of the inductor branch, ohms.</param>
/// <param name="OutputGain">Gv: inductor voltage per volt of output (with the sign taken out), V/V.</param>
internal sealed record AveragedBuck(double DutyGainV, double LineGain, double SeriesResistanceOhm, double OutputGain)
{
    /// <summary>The polynomials of the model at a power stage and load.</summary>
    public Parts Build(BuckPowerStage stage, double? loadOhm)
    {
        double l = stage.Inductor.InductanceH, c = stage.TotalCapacitanceF;
        double w = 1.0 / Math.Sqrt(l * c);
        var (ny, dy) = VoltageModeBuck.OutputAdmittance(stage, loadOhm, w);
        var zs = new Polynomial([SeriesResistanceOhm, l * w]);

        // v (Zs Y + Gv) = Ad d + Ag vg - Zs iload, so every function has the denominator Zs Ny + Gv Dy.
        var den = zs.Multiply(ny).Add(dy.Scale(OutputGain));
        return new Parts(this, w, ny, dy, zs, den);
    }

    /// <summary>The model's polynomials in x = s / w.</summary>
    /// <param name="Model">The coefficients.</param>
    /// <param name="W">The frequency scale w, rad/s.</param>
    /// <param name="Ny">Numerator of Y.</param>
    /// <param name="Dy">Denominator of Y.</param>
    /// <param name="Zs">Reff + s L.</param>
    /// <param name="Den">Zs Ny + Gv Dy.</param>
    internal sealed record Parts(AveragedBuck Model, double W, Polynomial Ny, Polynomial Dy, Polynomial Zs, Polynomial Den)
    {
        /// <summary>Gvd = Ad Dy / Den: duty cycle to output, V.</summary>
        public TransferFunction DutyToOutput => TransferFunction.FromScaledPolynomials(Model.DutyGainV, Dy, Den, W, 0.0);

        /// <summary>Gvg = Ag Dy / Den: input to output, open loop.</summary>
        public TransferFunction LineToOutput => TransferFunction.FromScaledPolynomials(Model.LineGain, Dy, Den, W, 0.0);

        /// <summary>Zout = Zs Dy / Den: -vout / iload, open loop, ohms.</summary>
        public TransferFunction OutputImpedance => TransferFunction.FromScaledPolynomials(1.0, Zs.Multiply(Dy), Den, W, 0.0);

        /// <summary>Gid = Ad Ny / Den: duty cycle to inductor current, A.</summary>
        public TransferFunction DutyToInductorCurrent => TransferFunction.FromScaledPolynomials(Model.DutyGainV, Ny, Den, W, 0.0);
    }
}
