using System.Globalization;
using System.Text;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Reporting;

/// <summary>Writes a <see cref="PlacementReport"/> as plain text: the placement, the figures and every derivation step.</summary>
public static class PlacementReportText
{
    private const int LabelWidth = 28;

    /// <summary>The report as text, ending with a newline.</summary>
    public static string Write(PlacementReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var t = new StringBuilder();
        var c = report.Compensator;
        t.Append("Design: ").Append(report.Name).Append('\n');
        t.Append("Suggested placement: ").Append(MethodName(report.Method)).Append(", ").Append(SynthesisReportText.TypeName(c.Type)).Append('\n');
        Line(t, "target crossover", Q(report.TargetCrossoverHz, "Hz"));
        Line(t, "target phase margin", F(report.TargetPhaseMarginDeg, "F1") + " deg");
        if (report.SwitchingFrequencyHz is not null)
        {
            Line(t, "switching frequency", Q(report.SwitchingFrequencyHz, "Hz"));
        }

        t.Append("\nCompensator\n");
        Line(t, "integrator frequency", Q(c.IntegratorHz, "Hz", 4));
        if (c.Zero1Hz is not null)
        {
            Line(t, "zeros", c.Zero2Hz is null ? Q(c.Zero1Hz, "Hz", 4) : $"{Q(c.Zero1Hz, "Hz", 4)}, {Q(c.Zero2Hz, "Hz", 4)}");
            Line(t, "poles", c.Pole2Hz is null ? Q(c.Pole1Hz, "Hz", 4) : $"{Q(c.Pole1Hz, "Hz", 4)}, {Q(c.Pole2Hz, "Hz", 4)}");
        }

        Line(t, "plant phase at crossover", F(report.PlantPhaseDeg, "F2") + " deg");
        Line(t, "boost required", F(report.RequiredBoostDeg, "F2") + " deg");
        Line(t, "boost given", F(report.ProvidedBoostDeg, "F2") + " deg");
        Line(t, "expected phase margin", F(report.ExpectedPhaseMarginDeg, "F2") + " deg");
        if (report.K is not null)
        {
            Line(t, "K factor", F(report.K, "G5"));
        }

        t.Append("\nDerivation\n");
        int i = 0;
        foreach (var d in report.Derivations)
        {
            t.Append(string.Create(CultureInfo.InvariantCulture, $"  {++i}. ")).Append(d.Quantity).Append('\n');
            t.Append("       ").Append(d.Formula).Append('\n');
            if (d.Substituted.Length > 0)
            {
                t.Append("       ").Append(d.Substituted).Append('\n');
            }

            if (d.Result.Length > 0)
            {
                t.Append("       = ").Append(d.Result).Append('\n');
            }

            t.Append("       (").Append(d.Source).Append(")\n");
        }

        if (!report.Warnings.IsDefaultOrEmpty)
        {
            t.Append("\nWarnings\n");
            foreach (var w in report.Warnings)
            {
                t.Append("  - ").Append(w).Append('\n');
            }
        }

        return t.ToString();
    }

    private static string MethodName(string method) => method switch
    {
        "kFactor" => "K factor (Venable 1983)",
        "voltageModeResonance" => "resonance placement, voltage mode",
        _ => "resonance placement, peak current mode",
    };

    private static void Line(StringBuilder t, string label, string value) => t.Append("  ").Append(label.PadRight(LabelWidth)).Append(value).Append('\n');

    private static string Q(double? value, string unit, int digits = 3) => value is double v ? Format(v, unit, digits) : "n/a";

    private static string F(double? value, string format) => value is double v ? v.ToString(format, CultureInfo.InvariantCulture) : "n/a";
}
