using LoopShaper.Core.Compensators;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Part values of the ideal OTA Type II compensator (infinite output resistance) and their inverse, on plain numbers so
/// that any OTA record can call them. The divider Hdiv sits ahead of the amplifier; gm drives Zo = (R2 + 1/(s C1)) || 1/(s C2):
/// Gc(s) = Hdiv gm (1 + s R2 C1) / (s (C1 + C2) (1 + s R2 C1 C2 / (C1 + C2))), so
/// fi = Hdiv gm / (2 pi (C1 + C2)), fz = 1 / (2 pi R2 C1), fp = (C1 + C2) / (2 pi R2 C1 C2)
/// (Basso 2012, ch. 3, OTA Type II; the impedance algebra is ours).
/// </summary>
public static class OtaSynthesis
{
    /// <summary>
    /// The exact inverse: C1 + C2 = Hdiv gm / (2 pi fi), C2 = (C1 + C2) fz / fp, C1 = (C1 + C2)(1 - fz / fp),
    /// R2 = 1 / (2 pi fz C1). Needs fp &gt; fz &gt; 0.
    /// </summary>
    /// <param name="transconductanceS">gm, siemens.</param>
    /// <param name="dividerRatio">Hdiv = Rbottom / (Rtop + Rbottom), 0..1.</param>
    /// <param name="integratorHz">fi, Hz.</param>
    /// <param name="zeroHz">fz, Hz.</param>
    /// <param name="poleHz">fp, Hz.</param>
    public static OtaTypeIIParts TypeII(double transconductanceS, double dividerRatio, double integratorHz, double zeroHz, double poleHz)
    {
        Require(transconductanceS > 0 && double.IsFinite(transconductanceS), nameof(transconductanceS), "gm must be a finite positive number of siemens.");
        Require(dividerRatio > 0 && dividerRatio <= 1, nameof(dividerRatio), "the divider ratio must be above 0 and at most 1.");
        Require(integratorHz > 0 && double.IsFinite(integratorHz), nameof(integratorHz), "fi must be a finite positive frequency.");
        Require(zeroHz > 0 && poleHz > zeroHz && double.IsFinite(poleHz), nameof(poleHz), "a Type II network needs 0 < fz < fp.");
        double total = dividerRatio * transconductanceS / (2 * Math.PI * integratorHz);
        double c2 = total * zeroHz / poleHz;
        double c1 = total - c2;
        return new OtaTypeIIParts(1.0 / (2 * Math.PI * zeroHz * c1), c1, c2);
    }

    /// <summary>The placement the parts give: fi, fz and fp of the formulas above.</summary>
    public static CompensatorPlacement TypeIIPlacement(double transconductanceS, double dividerRatio, OtaTypeIIParts parts)
    {
        const double twoPi = 2 * Math.PI;
        double total = parts.C1F + parts.C2F;
        return new CompensatorPlacement(
            CompensatorType.TypeII,
            new GainSetting(GainSettingKind.IntegratorHz, dividerRatio * transconductanceS / (twoPi * total)),
            Zero1Hz: 1.0 / (twoPi * parts.R2Ohm * parts.C1F),
            Pole1Hz: total / (twoPi * parts.R2Ohm * parts.C1F * parts.C2F));
    }

    private static void Require(bool ok, string name, string message)
    {
        if (!ok)
        {
            throw new ArgumentOutOfRangeException(name, message);
        }
    }
}
