using System.Globalization;
using System.Text;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Reporting;

/// <summary>Writes a <see cref="SynthesisReport"/> as plain text for a terminal: engineering notation, culture-invariant.</summary>
public static class SynthesisReportText
{
    private const int LabelWidth = 16;
    private const int ValueWidth = 14;
    private const int CriterionWidth = 34;

    /// <summary>The report as text, ending with a newline.</summary>
    public static string Write(SynthesisReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var t = new StringBuilder();
        bool searched = report.Searched is not null;
        t.Append("Design: ").Append(report.Name).Append('\n');
        t.Append("Synthesis: ").Append(TypeName(report.CompensatorType)).Append(report.Amplifier == SynthesisReport.Ota ? " OTA (transconductance) network, resistors " : " op-amp network, resistors ").Append(report.ResistorSeries)
            .Append(", capacitors ").Append(report.CapacitorSeries).Append(", neighbour search ")
            .Append(report.SearchNeighbours ? string.Create(CultureInfo.InvariantCulture, $"+-{report.SearchSteps} steps") : "off");
        if (report.SearchCandidates is int n)
        {
            t.Append(string.Create(CultureInfo.InvariantCulture, $" ({n} combinations)"));
        }

        t.Append('\n');
        t.Append("  targets: crossover ").Append(Q(report.TargetCrossoverHz, "Hz")).Append(", phase margin ").Append(F(report.TargetPhaseMarginDeg, "F1")).Append(" deg\n");

        Section(t, "Parts (ideal value, nearest preferred value, error against the ideal)");
        var header = new StringBuilder("  ").Append("part".PadRight(6)).Append("ideal".PadRight(ValueWidth)).Append("snapped".PadRight(ValueWidth)).Append("error".PadRight(10));
        if (searched)
        {
            header.Append("chosen".PadRight(ValueWidth)).Append("error".PadRight(10));
        }

        t.Append(header.Append("series".PadRight(8)).Append("tol.".PadRight(7)).Append("role").ToString().TrimEnd()).Append('\n');
        foreach (var p in report.Parts)
        {
            t.Append("  ").Append(p.Designator.PadRight(6)).Append(Q(p.IdealValue, p.Unit, 4).PadRight(ValueWidth)).Append(Q(p.SnappedValue, p.Unit).PadRight(ValueWidth))
                .Append(Pct(p.SnappedErrorPct).PadRight(10));
            if (searched)
            {
                t.Append(Q(p.ChosenValue, p.Unit).PadRight(ValueWidth)).Append(Pct(p.ChosenErrorPct).PadRight(10));
            }

            t.Append(p.Series.PadRight(8)).Append((F(p.TolerancePct, "G3") + " %").PadRight(7)).Append(p.Role).Append('\n');
        }

        Section(t, searched ? "Loop with ideal, snapped and searched parts" : "Loop with ideal and snapped parts");
        var columns = searched ? new[] { report.Ideal, report.Snapped, report.Searched! } : new[] { report.Ideal, report.Snapped };
        Row(t, string.Empty, searched ? ["ideal", "snapped", "searched"] : ["ideal", "snapped"]);
        Row(t, "crossover", [.. columns.Select(c => c.CrossoverHz is null ? "none" : Q(c.CrossoverHz, "Hz"))]);
        Row(t, "phase margin", [.. columns.Select(c => c.PhaseMarginDeg is null ? "n/a" : F(c.PhaseMarginDeg, "F1") + " deg")]);
        Row(t, "gain margin", [.. columns.Select(c => c.GainMarginDb is null ? "none" : F(c.GainMarginDb, "F1") + " dB")]);
        Row(t, "closed loop", [.. columns.Select(c => c.ClosedLoopStable ? "stable" : "UNSTABLE")]);

        Section(t, "Criteria with the chosen parts");
        foreach (var k in report.Criteria)
        {
            t.Append("  ").Append(k.Passed ? "PASS  " : "FAIL  ").Append(k.Name.PadRight(CriterionWidth)).Append(' ')
                .Append(k.Actual).Append("  (limit ").Append(k.Limit).Append(", ").Append(k.Path).Append(")\n");
        }

        t.Append(report.MeetsCriteria ? "  Result: the design with the chosen parts meets every criterion.\n" : "  Result: the design with the chosen parts does NOT meet every criterion.\n");
        if (!report.Warnings.IsDefaultOrEmpty)
        {
            Section(t, "Warnings");
            foreach (var w in report.Warnings)
            {
                t.Append("  - ").Append(w).Append('\n');
            }
        }

        return t.ToString();
    }

    /// <summary>"Type III" for "typeIII".</summary>
    internal static string TypeName(string word) => word switch { "typeI" => "Type I", "typeII" => "Type II", _ => "Type III" };

    private static void Row(StringBuilder t, string label, string[] values)
        => t.Append(("  " + label.PadRight(LabelWidth) + string.Concat(values.Select(v => v.PadRight(ValueWidth)))).TrimEnd()).Append('\n');

    private static void Section(StringBuilder t, string title) => t.Append('\n').Append(title).Append('\n');

    private static string Q(double? value, string unit, int digits = 3) => value is double v ? Format(v, unit, digits) : "n/a";

    private static string F(double? value, string format) => value is double v ? v.ToString(format, CultureInfo.InvariantCulture) : "n/a";

    private static string Pct(double? value) => value is double v ? v.ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture) + " %" : "n/a";
}
