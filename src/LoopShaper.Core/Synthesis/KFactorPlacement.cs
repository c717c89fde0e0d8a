using System.Globalization;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>Placement by Venable's K factor (Venable 1983): zeros below and poles above the crossover, spread by K.</summary>
internal static class KFactorPlacement
{
    /// <summary>Highest boost the automatic choice gives to a Type II before it takes a Type III (K = 5.7): common practice, no source.</summary>
    public const double AutoTypeIIMaxBoostDeg = 70.0;

    /// <summary>How far below its limit a boost beyond reach is clamped, degrees: our choice, so that K stays finite.</summary>
    public const double ClampBelowLimitDeg = 1.0;

    private const string Venable = "Venable 1983 (K factor)";

    public static PlacementSuggestion Place(TransferFunction plant, PlacementRequest r, List<Derivation> steps, List<string> warnings)
    {
        var inv = CultureInfo.InvariantCulture;
        double fc = r.CrossoverHz;
        double plantDeg = plant.PhaseDeg(fc);
        double boost = KFactor.RequiredBoostDeg(r.PhaseMarginDeg, plantDeg);
        steps.Add(new("Plant phase at the crossover", "phase(Fm Gvd(j 2 pi fc)), continuous", $"fc = {Format(fc, "Hz")}", Deg(plantDeg), "the plant model"));
        steps.Add(new("Required phase boost", "boost = PM - 90 - phase(Fm Gvd(fc))", string.Create(inv, $"boost = {r.PhaseMarginDeg:F2} - 90 - ({plantDeg:F2})"), Deg(boost), Venable));

        var type = r.Type ?? (boost <= 0 ? CompensatorType.TypeI : boost <= AutoTypeIIMaxBoostDeg ? CompensatorType.TypeII : CompensatorType.TypeIII);
        if (r.Type is null)
        {
            steps.Add(new("Compensator type", string.Create(inv, $"Type I for boost <= 0, Type II up to {AutoTypeIIMaxBoostDeg:F0} deg, Type III above"), Deg(boost), type.ToString(),
                "Venable 1983 (Type I when no boost is needed); the Type II/III threshold is common practice, no source"));
        }

        double used = boost;
        double? k = null;
        CompensatorPlacement shape;
        switch (type)
        {
            case CompensatorType.TypeI:
                if (boost > 0)
                {
                    warnings.Add(string.Create(inv, $"A Type I compensator gives no phase boost, but {boost:F1} deg are needed for {r.PhaseMarginDeg:F1} deg of phase margin at {Format(fc, "Hz")}; expect {90 + plantDeg:F1} deg. Choose Type II or III."));
                }

                used = 0;
                shape = new CompensatorPlacement(CompensatorType.TypeI, new GainSetting(GainSettingKind.CrossoverHz, fc));
                break;
            case CompensatorType.TypeII:
                used = Clamp(boost, KFactor.TypeIIMaxBoostDeg, "Type II", warnings, r, fc);
                k = KFactor.TypeII(used);
                steps.Add(new("K factor (Type II)", "K = tan(boost/2 + 45 deg)", string.Create(inv, $"K = tan({used:F2}/2 + 45)"), k.Value.ToString("G6", inv), Venable));
                steps.Add(new("Zero", "fz = fc / K", string.Create(inv, $"fz = {Format(fc, "Hz")} / {k:G6}"), Format(fc / k.Value, "Hz", 4), Venable));
                steps.Add(new("Pole", "fp = fc K", string.Create(inv, $"fp = {Format(fc, "Hz")} x {k:G6}"), Format(fc * k.Value, "Hz", 4), Venable));
                shape = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.CrossoverHz, fc), Zero1Hz: fc / k.Value, Pole1Hz: fc * k.Value);
                break;
            default:
                used = Clamp(boost, KFactor.TypeIIIMaxBoostDeg, "Type III", warnings, r, fc);
                k = KFactor.TypeIII(used);
                double sk = Math.Sqrt(k.Value);
                steps.Add(new("K factor (Type III)", "K = tan^2(boost/4 + 45 deg)", string.Create(inv, $"K = tan^2({used:F2}/4 + 45)"), k.Value.ToString("G6", inv), Venable));
                steps.Add(new("Double zero", "fz1 = fz2 = fc / sqrt(K)", string.Create(inv, $"fz = {Format(fc, "Hz")} / sqrt({k:G6})"), Format(fc / sk, "Hz", 4), Venable));
                steps.Add(new("Double pole", "fp1 = fp2 = fc sqrt(K)", string.Create(inv, $"fp = {Format(fc, "Hz")} x sqrt({k:G6})"), Format(fc * sk, "Hz", 4), Venable));
                shape = new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.CrossoverHz, fc), fc / sk, fc / sk, fc * sk, fc * sk);
                break;
        }

        return PlacementAdvisor.Finish(plant, r, shape, plantDeg, boost, k, steps, warnings);
    }

    private static double Clamp(double boost, double limit, string name, List<string> warnings, PlacementRequest r, double fc)
    {
        var inv = CultureInfo.InvariantCulture;
        if (boost >= limit)
        {
            double used = limit - ClampBelowLimitDeg;
            warnings.Add(string.Create(inv, $"The target is not reachable with {name}: {r.PhaseMarginDeg:F1} deg of phase margin at {Format(fc, "Hz")} needs {boost:F1} deg of boost, and {name} gives less than {limit:F0} deg. Placed for {used:F0} deg; lower the crossover or the phase margin{(name == "Type II" ? ", or use Type III" : string.Empty)}."));
            return used;
        }

        if (boost <= 0)
        {
            warnings.Add(string.Create(inv, $"No phase boost is needed ({boost:F1} deg): {name} is placed with K = 1 (its zeros and poles cancel at the crossover); Type I would do."));
            return 0.0;
        }

        return boost;
    }

    private static string Deg(double d) => d.ToString("F2", CultureInfo.InvariantCulture) + " deg";
}
