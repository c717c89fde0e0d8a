using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;
using Microsoft.AspNetCore.Components;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The figures an engineer checks first, the criteria verdicts, the warnings and the safety notice, all from the core.</summary>
public partial class SummaryPanel
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The latest analysis, or null.</summary>
    [Parameter]
    public DesignAnalysis? Analysis { get; set; }

    /// <summary>The corner sweep of the design, or null where there is none.</summary>
    [Parameter]
    public CornerWatch? Corners { get; set; }

    /// <summary>Why the analysis failed, or null.</summary>
    [Parameter]
    public string? ComputationError { get; set; }

    /// <summary>Input findings that no visible field shows.</summary>
    [Parameter]
    public IReadOnlyList<ValidationIssue> OtherFindings { get; set; } = [];

    /// <summary>Number of fields whose text cannot be read (the analysis used their last readable value).</summary>
    [Parameter]
    public int UnreadableFields { get; set; }

    // The engineer's choice to show or hide the criteria list; null until one is made.
    private bool? _criteriaChoice;

    /// <summary>
    /// The criteria list is shown while a criterion fails (or once asked for); a design that meets every one keeps the
    /// summary short, so that on a laptop screen the loop-gain chart starts higher up (the tiles carry the same figures).
    /// </summary>
    private bool CriteriaShown => _criteriaChoice ?? (Analysis is { MeetsCriteria: false });

    private void ToggleCriteria() => _criteriaChoice = !CriteriaShown;

    private List<string> Warnings
    {
        get
        {
            var list = new List<string>();
            if (UnreadableFields > 0)
            {
                list.Add($"{UnreadableFields} field(s) cannot be read; the figures use their last readable value.");
            }

            list.AddRange(OtherFindings.Select(i => $"{i.Field}: {i.Message}"));
            if (Analysis is not null)
            {
                list.AddRange(Analysis.Warnings.OrderByDescending(IsHazard));
            }

            return list;
        }
    }

    /// <summary>Where the criteria above were checked: the main operating point, not every corner.</summary>
    private string AtPoint => Analysis is not null && ClosedLoopPoint.MainCondition(Analysis.Design) is { } at
        ? $" at the analysed point ({Format(at.InputVoltageV, "V")}, {Format(at.LoadCurrentA, "A")}, nominal parts)"
        : string.Empty;

    /// <summary>pass or fail from the finished sweep of this very analysis; pending while it settles or runs.</summary>
    private string CornerState => Corners?.Table is CornerTable t && Corners.IsCurrentFor(Analysis) ? (t.AllPass ? "pass" : "fail") : "pending";

    private string CornerLine
    {
        get
        {
            if (Corners is null)
            {
                return "Corners: not swept.";
            }

            if (Corners.Run.State == RunState.Failed && ReferenceEquals(Corners.SweptFrom, Analysis))
            {
                return "Corners: the sweep failed: " + Corners.Run.Error;
            }

            if (Corners.Table is not CornerTable t)
            {
                return "Corners: sweeping in the background…";
            }

            string verdict = t.AllPass
                ? $"All {t.Rows.Length} corners meet the criteria"
                : $"{t.Failing.Count()} of {t.Rows.Length} corners miss a criterion";
            if (t.Worst.PhaseMargin is int w && t.Rows[w].Figures?.PhaseMarginDeg is double pm)
            {
                verdict += $"; smallest phase margin {pm.ToString("F1", Inv)} ° at {t.Rows[w].Corner.Label}";
            }

            return Corners.IsCurrentFor(Analysis) ? verdict + " (Corners card)." : verdict + " (last sweep; updating…)";
        }
    }

    private string RippleDetail
    {
        get
        {
            var c = Analysis?.Criteria.FirstOrDefault(x => x.Field == "criteria.minRippleFraction");
            return c is null ? "peak to peak" : $"pk-pk, {c.Actual} of full load";
        }
    }

    private static bool IsHazard(string warning) => warning.StartsWith("HAZARDOUS", StringComparison.Ordinal) || warning.StartsWith("LARGE STORED", StringComparison.Ordinal) || warning.StartsWith("HIGH AVAILABLE", StringComparison.Ordinal);

    private static string CrossoverDetail(StabilityMargins m) => m.GainCrossovers.Length switch
    {
        0 => "|T| never crosses 0 dB in range",
        1 => m.GainCrossovers[0].Falling ? "single, falling" : "single, rising",
        var n => $"{n} crossovers: " + string.Join(", ", m.GainCrossovers.Select(g => Format(g.FrequencyHz, "Hz"))),
    };

    private string? CriterionState(string field)
    {
        var c = Analysis?.Criteria.FirstOrDefault(x => x.Field == field);
        return c is null ? null : c.Passed ? "pass" : "fail";
    }

    private static string ModelName(SmallSignalModel model) => model switch
    {
        SmallSignalModel.VoltageModeContinuous or SmallSignalModel.PeakCurrentModeContinuous => "CCM",
        SmallSignalModel.VoltageModeDiscontinuous or SmallSignalModel.PeakCurrentModeDiscontinuous => "DCM",
        _ => "custom",
    };

    private static string ModelDetail(SmallSignalModel model) => model switch
    {
        SmallSignalModel.VoltageModeContinuous => "voltage mode, averaged CCM model",
        SmallSignalModel.VoltageModeDiscontinuous => "voltage mode, averaged DCM model (Sun et al. 2001)",
        SmallSignalModel.PeakCurrentModeContinuous => "peak current mode, Ridley 1991",
        SmallSignalModel.PeakCurrentModeDiscontinuous => "peak current mode, averaged DCM model",
        _ => "custom plant",
    };
}
