using System.Globalization;
using System.Text;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Core.Reporting;

/// <summary>Writes an <see cref="AnalysisReport"/> as plain text for a terminal: engineering notation, culture-invariant.</summary>
public static class AnalysisReportText
{
    private const string None = "none in the analysed range";
    private const int LabelWidth = 28;
    private const int CriterionWidth = 34;

    /// <summary>The report as text, ending with a newline.</summary>
    public static string Write(AnalysisReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var t = new StringBuilder();
        t.Append("Design: ").Append(report.Name).Append('\n');
        if (report.Description.Length > 0)
        {
            t.Append("  ").Append(report.Description).Append('\n');
        }

        if (!report.Valid)
        {
            Section(t, "Input errors");
            foreach (var i in report.Issues.Where(i => i.Severity == "error"))
            {
                t.Append("  ").Append(i.Path).Append(": ").Append(i.Message).Append('\n');
            }
        }

        if (report.OperatingPoint is { } op)
        {
            OperatingPoint(t, op);
        }

        if (report.SmallSignalModel is { } model)
        {
            Line(t, "small-signal model", ModelText(model));
        }

        if (report.CurrentMode is { } cm)
        {
            CurrentMode(t, cm);
        }

        if (report.Compensator is { } c)
        {
            Compensator(t, c);
        }

        if (report.Margins is { } m)
        {
            Margins(t, m);
        }

        if (report.IdealAmplifier is { } ia)
        {
            Section(t, "With an ideal amplifier instead");
            Line(t, "crossover", ia.CrossoverHz is null ? None : Q(ia.CrossoverHz, "Hz"));
            Line(t, "phase margin", ia.PhaseMarginDeg is null ? None : F(ia.PhaseMarginDeg, "F1") + " deg");
            Line(t, "gain margin", ia.GainMarginDb is null ? None : F(ia.GainMarginDb, "F1") + " dB");
        }

        if (!report.Corners.IsDefaultOrEmpty)
        {
            Corners(t, report);
        }

        if (report.CornerTable is { } ct)
        {
            CornerTable(t, ct);
        }

        if (report.ReferenceStep is { } r)
        {
            Section(t, $"Reference step of {Format(r.StepV ?? 0, "V")}");
            Step(t, r);
        }

        if (report.LoadStep is { } l)
        {
            string slew = l.SlewAPerS is > 0 ? $" rising at {Format(l.SlewAPerS.Value, "A/s")}" : " (ideal step)";
            Section(t, $"Load step of {Format(l.StepA ?? 0, "A")}{slew}: output deviation");
            Step(t, l);
        }

        if (!report.Criteria.IsDefaultOrEmpty)
        {
            Section(t, "Criteria");
            foreach (var k in report.Criteria)
            {
                t.Append("  ").Append(k.Passed ? "PASS  " : "FAIL  ").Append(k.Name.PadRight(CriterionWidth)).Append(' ')
                    .Append(k.Actual).Append("  (limit ").Append(k.Limit).Append(", ").Append(k.Path).Append(")\n");
            }

            t.Append(report.MeetsCriteria ? "  Result at the analysed operating point: the design meets every criterion.\n" : "  Result at the analysed operating point: the design does NOT meet every criterion.\n");
        }

        var inputWarnings = report.Issues.Where(i => i.Severity == "warning").ToList();
        if (!report.Warnings.IsDefaultOrEmpty || inputWarnings.Count > 0)
        {
            Section(t, "Warnings");
            foreach (var w in report.Warnings)
            {
                t.Append("  - ").Append(w).Append('\n');
            }

            foreach (var i in inputWarnings)
            {
                t.Append("  - ").Append(i.Path).Append(": ").Append(i.Message).Append('\n');
            }
        }

        Section(t, "Safety notice");
        t.Append("  ").Append(report.SafetyNotice).Append('\n');
        return t.ToString();
    }

    private static void OperatingPoint(StringBuilder t, OperatingPointReport op)
    {
        Section(t, $"Operating point at {Q(op.InputVoltageV, "V")} input, {Q(op.LoadCurrentA, "A")} load");
        Line(t, "duty cycle", $"{F(op.DutyCycle, "F4")} (ideal {F(op.IdealDutyCycle, "F4")})");
        Line(t, "inductor ripple current", $"{Q(op.RippleCurrentApp, "App")} ({F(op.RippleFractionOfFullLoad * 100, "F0")} % of full load)");
        Line(t, "peak / valley inductor", $"{Q(op.PeakInductorCurrentA, "A")} / {Q(op.ValleyInductorCurrentA, "A")}");
        Line(t, "output ripple", Q(op.OutputRippleVpp, "Vpp"));
        Line(t, "conduction mode", op.ConductionMode);
        Line(t, "DCM boundary (diode only)", Q(op.BoundaryLoadCurrentA, "A"));
        Line(t, "load resistance", op.LoadResistanceOhm is null ? "no load" : Q(op.LoadResistanceOhm, "Ohm"));
        Line(t, "effective input voltage", Q(op.EffectiveInputVoltageV, "V"));
        Line(t, "series resistance", Q(op.SeriesResistanceOhm, "Ohm"));
    }

    /// <summary>The model in words.</summary>
    private static string ModelText(string word) => word switch
    {
        "voltageModeCcm" => "voltage mode, CCM (averaged model, Erickson & Maksimovic ch. 7-8)",
        "voltageModeDcm" => "voltage mode, DCM (full-order averaged model, Sun et al. 2001)",
        "peakCurrentModeCcm" => "peak current mode, CCM (Ridley 1991)",
        "peakCurrentModeDcm" => "peak current mode, DCM (full-order DCM model with the peak-current law)",
        _ => "custom plant",
    };

    private static void CurrentMode(StringBuilder t, CurrentModeReport c)
    {
        Section(t, "Peak current mode");
        Line(t, "sense gain Ri", Q(c.SenseGainOhm, "Ohm"));
        Line(t, "slopes Sn / Sf / Se", $"{Q(c.OnSlopeVPerS, "V/s")} / {Q(c.OffSlopeVPerS, "V/s")} / {Q(c.RampSlopeVPerS, "V/s")}");
        Line(t, "mc", F(c.Mc, "F3"));
        Line(t, "modulator gain Fm", Q(c.ModulatorGainPerV, "1/V"));
        Line(t, "kf / kr", $"{F(c.Kf, "G4")} / {F(c.Kr, "G4")}");
        if (c.SamplingPoleHz is not null)
        {
            Line(t, "sampling double pole", Q(c.SamplingPoleHz, "Hz"));
            Line(t, "Qp", c.SubharmonicallyUnstable ? "none: mc D' - 0.5 <= 0, SUBHARMONIC OSCILLATION" : F(c.Qp, "F3"));
            Line(t, "ramp for Qp = 1", c.SuggestedRampForUnitQpVPerS is > 0 ? $"Se = {Q(c.SuggestedRampForUnitQpVPerS, "V/s")} (mc = {F(c.SuggestedMcForUnitQp, "F3")})" : "none needed");
            Line(t, "current-loop crossover", c.CurrentLoopCrossoverHz is null ? None : $"{Q(c.CurrentLoopCrossoverHz, "Hz")}, phase margin {F(c.CurrentLoopPhaseMarginDeg, "F1")} deg");
        }
        else
        {
            Line(t, "Qp", "none in DCM (the current starts from zero each period)");
        }
    }

    private static void Corners(StringBuilder t, AnalysisReport report)
    {
        Section(t, "Corners (input / load)");
        foreach (var c in report.Corners)
        {
            string where = $"{c.Input}/{c.Load}".PadRight(12) + $" {Q(c.InputVoltageV, "V")}, {Q(c.LoadCurrentA, "A")}".PadRight(20);
            string what = c.Model is null
                ? c.Note ?? "not analysed"
                : $"{c.Model}, D {F(c.DutyCycle, "F3")}, fc {(c.CrossoverHz is null ? "none" : Q(c.CrossoverHz, "Hz"))}, PM {(c.PhaseMarginDeg is null ? "none" : F(c.PhaseMarginDeg, "F1") + " deg")}, GM {(c.GainMarginDb is null ? "none" : F(c.GainMarginDb, "F1") + " dB")}{(c.Qp is null ? "" : ", Qp " + F(c.Qp, "F2"))}{(c.ClosedLoopStable == false ? ", UNSTABLE" : "")}{(c.Note is null ? "" : " (" + c.Note + ")")}";
            t.Append("  ").Append(where).Append(' ').Append(what).Append('\n');
        }
    }

    private static void CornerTable(StringBuilder t, CornerTableReport table)
    {
        Section(t, $"Corner table ({table.Rows.Count} corners: input x load x tolerances; * marks the worst of a column)");
        t.Append("  parameters: ").Append(string.Join(", ", table.Parameters)).Append('\n');
        t.Append("  ").Append("corner".PadRight(40)).Append(" model            fc           PM         GM up      GM low     load step    recovery    verdict\n");
        for (int i = 0; i < table.Rows.Count; i++)
        {
            var r = table.Rows[i];
            string Mark(int? worst) => worst == i ? "*" : " ";
            t.Append("  ").Append(r.Label.PadRight(40)).Append(' ')
                .Append((r.Model ?? "-").PadRight(16)).Append(' ')
                .Append((r.CrossoverHz is null ? "none" : Q(r.CrossoverHz, "Hz")).PadRight(11)).Append(Mark(table.HighestCrossoverRow)).Append(' ')
                .Append((r.PhaseMarginDeg is null ? "none" : F(r.PhaseMarginDeg, "F1") + " deg").PadRight(10)).Append(Mark(table.WorstPhaseMarginRow)).Append(' ')
                .Append((r.UpperGainMarginDb is null ? "none" : F(r.UpperGainMarginDb, "F1") + " dB").PadRight(9)).Append(Mark(table.WorstUpperGainMarginRow)).Append(' ')
                .Append((r.LowerGainMarginDb is null ? "none" : F(r.LowerGainMarginDb, "F1") + " dB").PadRight(10)).Append(' ')
                .Append((r.LoadStepDeviationV is null ? "-" : Q(r.LoadStepDeviationV, "V")).PadRight(11)).Append(Mark(table.WorstLoadStepRow)).Append(' ')
                .Append((r.RecoveryTimeS is null ? "-" : Q(r.RecoveryTimeS, "s")).PadRight(11)).Append(' ')
                .Append(r.Passed ? "pass" : "FAIL: " + string.Join("; ", r.Failures)).Append('\n');
        }

        t.Append("  verdict: ").Append(table.AllPass ? "every corner meets the criteria" : $"{table.Rows.Count(r => !r.Passed)} of {table.Rows.Count} corners FAIL").Append('\n');
    }

    private static void Compensator(StringBuilder t, CompensatorReport c)
    {
        Section(t, $"Compensator ({c.Type}, as analysed)");
        Line(t, "integrator frequency", Q(c.IntegratorHz, "Hz"));
        if (c.Zero1Hz is not null || c.Pole1Hz is not null)
        {
            Line(t, "zeros", c.Zero2Hz is null ? Q(c.Zero1Hz, "Hz") : $"{Q(c.Zero1Hz, "Hz")}, {Q(c.Zero2Hz, "Hz")}");
            Line(t, "poles", c.Pole2Hz is null ? Q(c.Pole1Hz, "Hz") : $"{Q(c.Pole1Hz, "Hz")}, {Q(c.Pole2Hz, "Hz")}");
        }
    }

    private static void Margins(StringBuilder t, MarginsReport m)
    {
        Section(t, $"Gain crossovers ({Q(m.StartHz, "Hz")} to {Q(m.StopHz, "Hz")})");
        if (m.GainCrossovers.IsDefaultOrEmpty)
        {
            t.Append("  ").Append(None).Append('\n');
        }

        foreach (var g in m.GainCrossovers)
        {
            t.Append("  ").Append(Q(g.FrequencyHz, "Hz").PadRight(12)).Append(" phase ").Append(F(g.PhaseDeg, "F1")).Append(" deg, phase margin ")
                .Append(F(g.PhaseMarginDeg, "F1")).Append(" deg").Append(g.Falling ? ", falling" : ", rising").Append('\n');
        }

        Section(t, "Phase crossovers");
        if (m.PhaseCrossovers.IsDefaultOrEmpty)
        {
            t.Append("  ").Append(None).Append('\n');
        }

        foreach (var p in m.PhaseCrossovers)
        {
            t.Append("  ").Append(Q(p.FrequencyHz, "Hz").PadRight(12)).Append(" phase ").Append(F(p.CriticalPhaseDeg, "F0")).Append(" deg, |T| ")
                .Append(F(p.MagnitudeDb, "F1")).Append(" dB, gain margin ").Append(F(p.GainMarginDb, "F1")).Append(" dB\n");
        }

        foreach (var touch in m.Touches)
        {
            t.Append("  |T| touches 0 dB at ").Append(Q(touch.FrequencyHz, "Hz")).Append(" (phase margin ").Append(F(touch.PhaseMarginDeg, "F1")).Append(" deg)\n");
        }

        Section(t, "Margins");
        Line(t, "phase margin", m.PhaseMarginDeg is null ? None : $"{F(m.PhaseMarginDeg, "F1")} deg at {Q(m.CrossoverHz, "Hz")}{(m.MultipleCrossovers ? " (several crossovers: the smallest)" : string.Empty)}");
        Line(t, "upper gain margin", m.UpperGainMarginDb is null ? None : $"{F(m.UpperGainMarginDb, "F1")} dB at {Q(m.UpperGainMarginHz, "Hz")}");
        Line(t, "lower gain margin", m.LowerGainMarginDb is null ? None : $"{F(m.LowerGainMarginDb, "F1")} dB at {Q(m.LowerGainMarginHz, "Hz")} (conditionally stable)");
        Line(t, "delay margin", m.DelayMarginS is null ? "none" : Q(m.DelayMarginS, "s"));
        string pade = m.ClosedLoopPadeOrder is int n ? string.Create(CultureInfo.InvariantCulture, $", loop delay as a Pade approximation of order {n}") : string.Empty;
        Line(t, "closed loop", (m.ClosedLoopStable ? "stable" : "UNSTABLE") + string.Create(CultureInfo.InvariantCulture, $" ({m.OpenLoopRhpPoles} open-loop right-half-plane poles{pade})"));
    }

    private static void Step(StringBuilder t, StepReport s)
    {
        Line(t, "final value", s.FinalValueV is null ? "unbounded" : Q(s.FinalValueV, "V"));
        Line(t, "peak deviation", $"{Q(s.PeakDeviationV, "V")} at {Q(s.PeakTimeS, "s")}");
        Line(t, "overshoot", s.OvershootPct is null ? "n/a" : F(s.OvershootPct, "F1") + " %");
        Line(t, "undershoot", s.UndershootPct is null ? "n/a" : F(s.UndershootPct, "F1") + " %");
        Line(t, "rise time (10-90 %)", s.RiseTimeS is null ? "n/a" : Q(s.RiseTimeS, "s"));
        Line(t, "settling time (2 %)", s.SettlingTimeS is null ? $"not settled within {Q(s.DurationS, "s")}" : Q(s.SettlingTimeS, "s"));
        if (s.DelayTreatment == "pade")
        {
            Line(t, "delay", string.Create(CultureInfo.InvariantCulture, $"Pade approximation of order {s.PadeOrder}"));
        }
        else if (s.DelayTreatment == "exactShift")
        {
            Line(t, "delay", "exact time shift");
        }
    }

    private static void Section(StringBuilder t, string title) => t.Append('\n').Append(title).Append('\n');

    private static void Line(StringBuilder t, string label, string value) => t.Append("  ").Append(label.PadRight(LabelWidth)).Append(value).Append('\n');

    private static string Q(double? value, string unit) => value is double v ? Format(v, unit) : "n/a";

    private static string F(double? value, string format) => value is double v ? v.ToString(format, CultureInfo.InvariantCulture) : "n/a";
}
