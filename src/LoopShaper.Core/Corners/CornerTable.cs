using System.Collections.Immutable;

namespace LoopShaper.Core.Corners;

/// <summary>The corner analysis of a design: the parameters, one row per corner, the worst row per figure and the verdict.</summary>
/// <param name="Parameters">The toleranced parameters; every row's factors follow this order.</param>
/// <param name="WorstCaseFactors">The factors of the sensitivity-directed worst case (<see cref="ToleranceSet.WorstCase"/>).</param>
/// <param name="Rows">One row per corner, in the order of the corner set.</param>
/// <param name="Worst">The worst row for each figure.</param>
public sealed record CornerTable(ImmutableArray<ToleranceParameter> Parameters, ImmutableArray<double> WorstCaseFactors, ImmutableArray<CornerRow> Rows, CornerWorst Worst)
{
    /// <summary>True when every corner was analysed and passes.</summary>
    public bool AllPass => Rows.All(r => r.Passed);

    /// <summary>Rows that fail or could not be analysed.</summary>
    public IEnumerable<CornerRow> Failing => Rows.Where(r => !r.Passed);

    /// <summary>The smallest phase margin over the corners, degrees; null when no corner has a crossover.</summary>
    public double? WorstPhaseMarginDeg => Worst.PhaseMargin is int i ? Rows[i].Figures!.PhaseMarginDeg : null;

    /// <summary>The rows with a loop response for an overlaid Bode plot, the row with the worst phase margin last (drawn on top).</summary>
    public IEnumerable<CornerRow> OverlayOrder()
        => Rows.Where((r, i) => r.LoopResponse is not null && i != Worst.PhaseMargin)
            .Concat(Worst.PhaseMargin is int w && Rows[w].LoopResponse is not null ? [Rows[w]] : []);
}
