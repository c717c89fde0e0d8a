using System.Collections.Immutable;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.Loop;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Web.Model;

/// <summary>
/// Where the closed-loop charts look: the main analysis's operating point, or one corner of <see cref="CornerSet.Full"/>
/// (input and load corner with a tolerance set), the design there built as the corner sweep builds it.
/// </summary>
public static class ClosedLoopPoint
{
    /// <summary>Key of the main analysis.</summary>
    public const string Main = "main";

    /// <summary>The corners on offer.</summary>
    public static ImmutableArray<CornerPoint> Corners => CornerSet.Full;

    /// <summary>Selector key of a corner.</summary>
    public static string Key(CornerPoint corner) => $"{corner.Input}-{corner.Load}-{corner.Tolerances}";

    /// <summary>
    /// The closed-loop performance at a key (<see cref="Main"/> or a corner's <see cref="Key"/>): the design with its
    /// tolerances at the corner's factors (<see cref="ToleranceModel.Apply"/>, a crossover target resolved once as
    /// <see cref="CornerSweep.Fixed"/> does) analysed by <see cref="ClosedLoopAnalyzer"/> at the corner's condition.
    /// </summary>
    public static ClosedLoopPerformance Analyze(LoopDesign design, string key, CancellationToken cancellation = default)
    {
        var corner = Corners.FirstOrDefault(c => Key(c) == key);
        if (corner is null)
        {
            return ClosedLoopAnalyzer.Analyze(design);
        }

        var fixedDesign = CornerSweep.Fixed(design);
        var parameters = ToleranceModel.Parameters(fixedDesign);
        double[] factors = corner.Tolerances == ToleranceSet.WorstCase
            ? CornerSweep.WorstCaseFactors(fixedDesign, parameters, new CornerSweepOptions(MaxDegreeOfParallelism: 1), cancellation)
            : ToleranceModel.Factors(parameters, corner.Tolerances);
        var atCorner = ToleranceModel.Apply(fixedDesign, parameters, factors);
        return ClosedLoopAnalyzer.Analyze(atCorner, CornerSweep.ConditionOf(fixedDesign, corner));
    }

    /// <summary>Input voltage and load current of the main analysis, or null for a custom plant.</summary>
    public static OperatingCondition? MainCondition(LoopDesign design)
        => design.Plant is BuckPlant b ? DesignAnalyzer.ConditionOf(b.PowerStage, design.Analysis) : null;
}
