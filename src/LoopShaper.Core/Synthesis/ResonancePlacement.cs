using System.Globalization;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.TransferFunctions;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Placement at the plant's own corner frequencies (common practice, no source): for voltage mode a Type III with its
/// double zero at the output LC resonance, a pole at the ESR zero and a pole at half the switching frequency; for peak
/// current mode a Type II with its zero at the load pole and its pole at the ESR zero or half the switching frequency.
/// </summary>
internal static class ResonancePlacement
{
    private const string Practice = "common practice, no source";

    public static PlacementSuggestion Place(TransferFunction plant, PlacementRequest r, List<Derivation> steps, List<string> warnings)
    {
        var inv = CultureInfo.InvariantCulture;
        double fc = r.CrossoverHz;
        double fs = r.SwitchingFrequencyHz!.Value;
        double half = fs / 2;
        var f = PlantFeatures.Of(plant);
        double plantDeg = plant.PhaseDeg(fc);
        double boost = KFactor.RequiredBoostDeg(r.PhaseMarginDeg, plantDeg);
        steps.Add(new("Half the switching frequency", "fs / 2", $"{Format(fs, "Hz")} / 2", Format(half, "Hz"), Practice));
        if (f.EsrZeroHz is double ez)
        {
            steps.Add(new("ESR zero", "lowest real left-half-plane zero of Fm Gvd", plant.ToString(), Format(ez, "Hz", 4), "the plant model"));
        }

        // The pole that cancels the ESR zero: only where the zero lies above the lower corner and below fs / 2.
        double Pole(double lower)
        {
            if (f.EsrZeroHz is double z && z > lower && z < half)
            {
                return z;
            }

            warnings.Add(f.EsrZeroHz is double z2
                ? $"The ESR zero ({Format(z2, "Hz")}) is not between {Format(lower, "Hz")} and fs/2; that pole goes to fs/2 ({Format(half, "Hz")})."
                : $"The plant has no ESR zero; that pole goes to fs/2 ({Format(half, "Hz")}).");
            return half;
        }

        CompensatorPlacement shape;
        if (r.Method == PlacementMethod.VoltageModeResonance)
        {
            if (f.ResonanceHz is not double f0)
            {
                throw new ArgumentException("The plant has no output LC resonance (fewer than two poles): the voltage-mode resonance placement needs one; use the K factor.", nameof(plant));
            }

            steps.Add(new("Output LC resonance", f.ResonanceQ is double q ? "f0 = |p| / (2 pi), lowest complex pole pair of Fm Gvd" : "f0 = sqrt(p1 p2) / (2 pi), two lowest real poles of Fm Gvd",
                f.ResonanceQ is double q2 ? string.Create(inv, $"Q = {q2:F3}") : plant.ToString(), Format(f0, "Hz", 4), "the plant model"));
            double p1 = Pole(f0);
            steps.Add(new("Double zero", "fz1 = fz2 = f0", $"f0 = {Format(f0, "Hz", 4)}", Format(f0, "Hz", 4), Practice));
            steps.Add(new("First pole", "fp1 = fesr (fs/2 when the ESR zero is missing or out of range)", $"fp1 = {Format(p1, "Hz", 4)}", Format(p1, "Hz", 4), Practice));
            steps.Add(new("Second pole", "fp2 = fs / 2", $"fp2 = {Format(half, "Hz", 4)}", Format(half, "Hz", 4), Practice));
            if (fc <= f0)
            {
                warnings.Add($"The target crossover {Format(fc, "Hz")} is at or below the LC resonance {Format(f0, "Hz")}: the resonance placement is meant for a crossover above it.");
            }

            shape = new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.CrossoverHz, fc), f0, f0, p1, half);
        }
        else
        {
            if (f.LoadPoleHz is not double fl)
            {
                throw new ArgumentException("The plant has no real pole to take as the load pole: the current-mode resonance placement needs one; use the K factor.", nameof(plant));
            }

            steps.Add(new("Load pole", "lowest real pole of Fm Gvd", plant.ToString(), Format(fl, "Hz", 4), "the plant model"));
            double p = Pole(fl);
            steps.Add(new("Zero", "fz = load pole", $"fz = {Format(fl, "Hz", 4)}", Format(fl, "Hz", 4), Practice));
            steps.Add(new("Pole", "fp = fesr (fs/2 when the ESR zero is missing or out of range)", $"fp = {Format(p, "Hz", 4)}", Format(p, "Hz", 4), Practice));
            shape = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.CrossoverHz, fc), Zero1Hz: fl, Pole1Hz: p);
        }

        double limit = shape.Type == CompensatorType.TypeII ? KFactor.TypeIIMaxBoostDeg : KFactor.TypeIIIMaxBoostDeg;
        if (boost >= limit)
        {
            warnings.Add(string.Create(inv, $"The target is not reachable: {r.PhaseMarginDeg:F1} deg of phase margin at {Format(fc, "Hz")} needs {boost:F1} deg of boost, and {shape.Type} gives less than {limit:F0} deg."));
        }

        return PlacementAdvisor.Finish(plant, r, shape, plantDeg, boost, null, steps, warnings);
    }
}
