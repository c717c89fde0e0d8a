using System.Collections.Immutable;
using LoopShaper.Core.Design;

namespace LoopShaper.Core.Corners;

/// <summary>The standard corner sets.</summary>
public static class CornerSet
{
    private static readonly InputCorner[] Inputs = [InputCorner.Min, InputCorner.Nominal, InputCorner.Max];
    private static readonly LoadCorner[] Loads = [LoadCorner.Min, LoadCorner.Nominal, LoadCorner.Max];

    /// <summary>3 input corners x 3 load corners x 4 tolerance sets (nominal, all low, all high, worst case): 36 corners.</summary>
    public static ImmutableArray<CornerPoint> Full { get; } = Of([ToleranceSet.Nominal, ToleranceSet.AllLow, ToleranceSet.AllHigh, ToleranceSet.WorstCase]);

    /// <summary>3 input corners x 3 load corners with nominal parts: 9 corners.</summary>
    public static ImmutableArray<CornerPoint> OperatingOnly { get; } = Of([ToleranceSet.Nominal]);

    /// <summary>Every input and load corner with each of the given tolerance sets, input varying slowest.</summary>
    public static ImmutableArray<CornerPoint> Of(IEnumerable<ToleranceSet> sets)
    {
        var list = sets.ToList();
        return [.. from i in Inputs from l in Loads from t in list select new CornerPoint(i, l, t)];
    }
}
