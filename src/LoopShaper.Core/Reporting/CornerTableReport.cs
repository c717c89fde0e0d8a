using LoopShaper.Core.Corners;

namespace LoopShaper.Core.Reporting;

/// <summary>The corner table (<see cref="CornerTable"/>) as plain data: parameters, rows, the worst row per figure and the verdict.</summary>
/// <param name="Parameters">Names of the toleranced parameters.</param>
/// <param name="Rows">One row per corner.</param>
/// <param name="WorstPhaseMarginRow">Row index of the smallest phase margin.</param>
/// <param name="WorstUpperGainMarginRow">Row index of the smallest upper gain margin.</param>
/// <param name="WorstLoadStepRow">Row index of the largest load-step deviation.</param>
/// <param name="HighestCrossoverRow">Row index of the highest crossover.</param>
/// <param name="AllPass">True when every corner meets every criterion.</param>
public sealed record CornerTableReport(
    IReadOnlyList<string> Parameters,
    IReadOnlyList<CornerRowReport> Rows,
    int? WorstPhaseMarginRow,
    int? WorstUpperGainMarginRow,
    int? WorstLoadStepRow,
    int? HighestCrossoverRow,
    bool AllPass)
{
    /// <summary>The report of a corner table.</summary>
    public static CornerTableReport From(CornerTable table) => new(
        [.. table.Parameters.Select(p => p.Name)],
        [.. table.Rows.Select(r => new CornerRowReport(r.Corner.Label, r.Condition.InputVoltageV, r.Condition.LoadCurrentA, r.Model is null ? null : AnalysisReport.ModelWord(r.Model.Value),
            r.Figures?.CrossoverHz, r.Figures?.PhaseMarginDeg, r.Figures?.UpperGainMarginDb, r.Figures?.LowerGainMarginDb, r.Figures?.IsClosedLoopStable, r.LoadStepDeviationV, r.RecoveryTimeS, r.Passed, [.. r.Failures]))],
        table.Worst.PhaseMargin,
        table.Worst.UpperGainMargin,
        table.Worst.LoadStepDeviation,
        table.Worst.HighestCrossover,
        table.AllPass);
}
