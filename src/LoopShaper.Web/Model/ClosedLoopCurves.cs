using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using LoopShaper.Core.Loop;

namespace LoopShaper.Web.Model;

/// <summary>
/// Open- and closed-loop output impedance and line-to-output (audio susceptibility) responses of one loop, from the
/// core's <see cref="LoopModel"/>: Zout/(1+T) and Gvg/(1+T), Erickson and Maksimovic 2nd ed. sec. 9.2. Null where the
/// plant model has no such function (a custom plant).
/// </summary>
/// <param name="OutputImpedanceOpen">Zout(s) of the power stage alone, dB re 1 Ohm.</param>
/// <param name="OutputImpedanceClosed">Zout/(1+T), dB re 1 Ohm.</param>
/// <param name="LineToOutputOpen">Gvg(s), dB.</param>
/// <param name="LineToOutputClosed">Gvg/(1+T), dB.</param>
public sealed record ClosedLoopCurves(
    FrequencyResponse? OutputImpedanceOpen,
    FrequencyResponse? OutputImpedanceClosed,
    FrequencyResponse? LineToOutputOpen,
    FrequencyResponse? LineToOutputClosed)
{
    /// <summary>The curves of a loop over the analysis range, on a grid denser near the loop's poles and zeros; a loop delay enters as the core's Pade approximation.</summary>
    public static ClosedLoopCurves Of(LoopModel loop, AnalysisSettings range, double? crossoverHz)
    {
        var grid = new FrequencyGrid(range.StartHz, range.StopHz, range.Points).Adaptive([loop.Plant, loop.Compensator]);
        int? pade = loop.PadeOrder(crossoverHz ?? Math.Sqrt(range.StartHz * range.StopHz));
        return new ClosedLoopCurves(
            loop.OutputImpedance is { } z ? FrequencyResponse.Of(z, grid) : null,
            loop.ClosedOutputImpedance(pade) is { } zc ? FrequencyResponse.Of(zc, grid) : null,
            loop.LineToOutput is { } g ? FrequencyResponse.Of(g, grid) : null,
            loop.ClosedLineToOutput(pade) is { } gc ? FrequencyResponse.Of(gc, grid) : null);
    }

    /// <summary>The curves of an analysis's main operating point, or null when it was not analysed.</summary>
    public static ClosedLoopCurves? Of(DesignAnalysis analysis)
        => analysis.Loop is LoopModel loop ? Of(loop, analysis.Design.Analysis, analysis.Margins?.CrossoverHz) : null;

    /// <summary>
    /// The curves at one corner of the input and load ranges, the compensator as the main analysis resolved it (the
    /// same hardware at every corner, as <see cref="DesignAnalyzer.Corners"/> does); null when the corner has no model.
    /// </summary>
    public static ClosedLoopCurves? At(DesignAnalysis analysis, CornerResult corner)
    {
        if (!analysis.IsValid || corner.Model is null)
        {
            return null;
        }

        var design = analysis.Design;
        if (design.Compensator is LoopShaper.Core.Compensators.CompensatorPlacement { Gain.Kind: LoopShaper.Core.Compensators.GainSettingKind.CrossoverHz } && analysis.ResolvedPlacement is { } resolved)
        {
            design = design with { Compensator = resolved };
        }

        var loop = DesignAnalyzer.BuildLoop(design, corner.Condition).Loop;
        return Of(loop, design.Analysis, corner.CrossoverHz);
    }
}
