using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Derivations;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Validation;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Suggests a compensator placement from a target crossover and phase margin, by Venable's K factor or at the plant's
/// own corner frequencies, with every step written out.
/// </summary>
public static class PlacementAdvisor
{
    /// <summary>Default target crossover as a fraction of the switching frequency, fs / 10: common practice, no source.</summary>
    public const double DefaultCrossoverFractionOfSwitching = 0.1;

    /// <summary>Highest crossover before the warning, as a fraction of the switching frequency, fs / 5: common practice, no source (shared/CONVENTIONS.md).</summary>
    public const double MaxCrossoverFractionOfSwitching = 0.2;

    /// <summary>
    /// The request a design implies: the target phase margin is the criteria's minimum, the crossover fs / 10, unless given.
    /// </summary>
    public static PlacementRequest RequestFor(LoopDesign design, PlacementMethod method, CompensatorType? type = null, double? crossoverHz = null, double? phaseMarginDeg = null)
    {
        double? fs = SwitchingFrequencyOf(design.Plant);
        double fc = crossoverHz ?? (fs is double f ? DefaultCrossoverFractionOfSwitching * f : double.NaN);
        return new PlacementRequest(method, fc, phaseMarginDeg ?? design.Criteria.MinPhaseMarginDeg, type, fs);
    }

    /// <summary>Checks a request; errors name the field and the allowed range.</summary>
    public static ImmutableArray<ValidationIssue> Validate(PlacementRequest request)
    {
        var c = new Checks();
        if (double.IsNaN(request.CrossoverHz))
        {
            c.Error("synthesis.crossoverHz", "is not set: give a target crossover (the default fs / 10 needs a switching frequency).");
        }
        else
        {
            c.Above("synthesis.crossoverHz", request.CrossoverHz, 0.0, 1e9, "Hz");
        }

        c.Above("synthesis.phaseMarginDeg", request.PhaseMarginDeg, 0.0, 179.0, "deg");
        if (request.SwitchingFrequencyHz is double fs)
        {
            c.Above("synthesis.switchingFrequencyHz", fs, 0.0, 1e10, "Hz");
        }
        else if (request.Method != PlacementMethod.KFactor)
        {
            c.Error("synthesis.switchingFrequencyHz", "is not set: the resonance placements put a pole at half the switching frequency.");
        }

        if (request.Method != PlacementMethod.KFactor && request.Type is CompensatorType t
            && t != (request.Method == PlacementMethod.VoltageModeResonance ? CompensatorType.TypeIII : CompensatorType.TypeII))
        {
            c.Warn("synthesis.type", $"{t} is ignored: the {request.Method} placement is {(request.Method == PlacementMethod.VoltageModeResonance ? "Type III" : "Type II")}.");
        }

        return [.. c.Issues];
    }

    /// <summary>Suggests a placement for the plant Fm Gvd (control voltage to output). Throws <see cref="ArgumentException"/> with the validation messages for a bad request.</summary>
    public static PlacementSuggestion Suggest(TransferFunction plant, PlacementRequest request)
    {
        if (!TrySuggest(plant, request, out var suggestion, out var issues))
        {
            throw new ArgumentException(string.Join(" ", issues.Where(i => i.Severity == Severity.Error)), nameof(request));
        }

        return suggestion!;
    }

    /// <summary>Suggests a placement; false with the reasons when the request is bad or the plant lacks what the method needs.</summary>
    public static bool TrySuggest(TransferFunction plant, PlacementRequest request, out PlacementSuggestion? suggestion, out ImmutableArray<ValidationIssue> issues)
    {
        suggestion = null;
        issues = Validate(request);
        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return false;
        }

        var steps = new List<Derivation>();
        var warnings = new List<string>(issues.Select(i => i.ToString()));
        if (request.SwitchingFrequencyHz is double fs && request.CrossoverHz > MaxCrossoverFractionOfSwitching * fs)
        {
            warnings.Add($"The target crossover {Format(request.CrossoverHz, "Hz")} is above a fifth of the switching frequency ({Format(MaxCrossoverFractionOfSwitching * fs, "Hz")}): the averaged model loses accuracy there and sampling effects erode the phase margin (common practice, no source).");
        }

        try
        {
            suggestion = request.Method == PlacementMethod.KFactor
                ? KFactorPlacement.Place(plant, request, steps, warnings)
                : ResonancePlacement.Place(plant, request, steps, warnings);
            return true;
        }
        catch (ArgumentException ex)
        {
            issues = issues.Add(new ValidationIssue("synthesis.method", ex.Message.Split(" (Parameter")[0]));
            return false;
        }
    }

    /// <summary>Suggests a placement for a design, at the operating point of its analysis settings.</summary>
    public static PlacementSuggestion Suggest(LoopDesign design, PlacementRequest request) => Suggest(DesignAnalyzer.BuildLoop(design).Loop.Plant, request);

    /// <summary>The switching frequency of a plant, when it has one.</summary>
    public static double? SwitchingFrequencyOf(Plant plant) => plant switch
    {
        BuckPlant b => b.PowerStage.SwitchingFrequencyHz,
        CustomPlant c => c.SwitchingFrequencyHz,
        _ => null,
    };

    /// <summary>Fixes the gain so that |T(j 2 pi fc)| = 1 and writes the common closing steps.</summary>
    internal static PlacementSuggestion Finish(TransferFunction plant, PlacementRequest r, CompensatorPlacement shape, double plantDeg, double boost, double? k, List<Derivation> steps, List<string> warnings)
    {
        var inv = CultureInfo.InvariantCulture;
        double fc = r.CrossoverHz;
        double fi = shape.IntegratorHz(plant);
        var placement = shape with { Gain = new GainSetting(GainSettingKind.IntegratorHz, fi) };
        double compDeg = placement.UnitShape().PhaseDeg(fc);
        double provided = 90.0 + compDeg;
        double pm = 180.0 + compDeg + plantDeg;
        steps.Add(new("Integrator frequency", "fi = 1 / (2 pi |Gc1(j 2 pi fc)| |Fm Gvd(j 2 pi fc)|), Gc1 the compensator with wi = 1 rad/s",
            string.Create(inv, $"|Fm Gvd| = {plant.MagnitudeDb(fc):F2} dB, |Gc1| = {placement.UnitShape().MagnitudeDb(fc):F2} dB at {Format(fc, "Hz")}"), Format(fi, "Hz", 4), "definition of the crossover |T(j 2 pi fc)| = 1"));
        steps.Add(new("Boost given at the crossover", "90 + phase(Gc(j 2 pi fc))", string.Create(inv, $"90 + ({compDeg:F2})"), provided.ToString("F2", inv) + " deg", "sum of the factor angles"));
        steps.Add(new("Expected phase margin", "PM = 180 + phase(Gc) + phase(Fm Gvd) at fc", string.Create(inv, $"PM = 180 + ({compDeg:F2}) + ({plantDeg:F2})"), pm.ToString("F2", inv) + " deg", "shared conventions: margins against -180 degrees"));
        if (pm < r.PhaseMarginDeg - 0.05)
        {
            warnings.Add(string.Create(inv, $"The placement gives {pm:F1} deg of phase margin at {Format(fc, "Hz")}, below the {r.PhaseMarginDeg:F1} deg asked for."));
        }

        steps.Add(new("Suggested compensator", "Gc(s) = (wi/s) prod(1 + s/wz) / prod(1 + s/wp)", placement.ToString(), string.Empty, "Erickson & Maksimovic, 2nd ed., sec. 9.5"));
        return new PlacementSuggestion(r, placement, plantDeg, boost, provided, pm, k, [.. steps], [.. warnings]);
    }
}
