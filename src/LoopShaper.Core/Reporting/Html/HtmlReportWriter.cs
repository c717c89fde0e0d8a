using System.Globalization;
using System.Net;
using System.Reflection;
using System.Text;
using System.Text.Json;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using LoopShaper.Core.Units;

namespace LoopShaper.Core.Reporting.Html;

/// <summary>
/// A printable, self-contained HTML report of a design (docs/report.md): inputs, operating point, Bode and step charts
/// as inline SVG, margins, corners, criteria, parts list, warnings and the safety notice, with the LoopShaper version
/// and the date. No script, no font or image from the network: it opens and prints offline. The print style sets the
/// @page size (A4 or Letter) and keeps tables, charts and their headings from splitting across pages.
/// </summary>
public static class HtmlReportWriter
{
    /// <summary>The notice at the foot of every page-end of a report: <see cref="DesignAnalysis.SafetyNotice"/> in one line.</summary>
    public const string ShortSafetyNotice = "Small-signal estimates to be confirmed by measurement on hardware; local codes and licensed practice prevail.";

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The LoopShaper version of this build (the informational version without its source revision).</summary>
    public static string BuildVersion
    {
        get
        {
            string? v = typeof(HtmlReportWriter).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion;
            return v is null ? "unknown" : v.Split('+')[0];
        }
    }

    /// <summary>The report of an analysed design as an HTML document.</summary>
    public static string Write(DesignAnalysis analysis, HtmlReportOptions options)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        ArgumentNullException.ThrowIfNull(options);
        var report = AnalysisReport.From(analysis);
        var d = analysis.Design;
        string version = options.Version ?? BuildVersion;
        string date = options.GeneratedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm 'UTC'", Inv);
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        sb.Append("<meta name=\"generator\" content=\"LoopShaper ").Append(E(version)).Append("\">\n");
        sb.Append("<title>").Append(E(d.Name)).Append(" · LoopShaper report</title>\n<style>\n").Append(Style(options.Paper)).Append("</style>\n</head>\n<body>\n");

        sb.Append("<header class=\"report-head\">\n<h1>").Append(E(d.Name)).Append("</h1>\n");
        if (d.Description.Length > 0)
        {
            sb.Append("<p class=\"desc\">").Append(E(d.Description)).Append("</p>\n");
        }

        sb.Append("<p class=\"meta\">LoopShaper ").Append(E(version)).Append(" · generated ").Append(E(date))
          .Append(" · paper ").Append(options.Paper == PaperSize.A4 ? "A4" : "Letter").Append("</p>\n");
        sb.Append("<p class=\"verdict ").Append(report.MeetsCriteria ? "pass\">Meets every design criterion" : report.Valid ? "fail\">Does not meet every design criterion" : "fail\">Not analysed: the design has input errors").Append("</p>\n");
        sb.Append("<p class=\"notice\" data-safety-notice><strong>Safety notice.</strong> ").Append(E(DesignAnalysis.SafetyNotice)).Append("</p>\n");
        foreach (var w in report.Warnings.Where(IsHazard))
        {
            sb.Append("<p class=\"hazard\" data-hazard>").Append(E(w)).Append("</p>\n");
        }

        sb.Append("</header>\n");

        Summary(sb, report);
        Inputs(sb, d);
        OperatingPoint(sb, report.OperatingPoint);
        Bode(sb, analysis, report.Margins);
        Steps(sb, analysis, report);
        Corners(sb, report);
        Criteria(sb, report);
        Parts(sb, d, analysis.IsValid);
        Findings(sb, report);

        sb.Append("<footer class=\"report-foot\"><p>").Append(E(ShortSafetyNotice)).Append("</p><p>LoopShaper ").Append(E(version)).Append(" · ").Append(E(date)).Append("</p></footer>\n");
        sb.Append("</body>\n</html>\n");
        return sb.ToString();
    }

    private static bool IsHazard(string warning) => warning.StartsWith("HAZARDOUS", StringComparison.Ordinal) || warning.StartsWith("LARGE STORED", StringComparison.Ordinal) || warning.StartsWith("HIGH AVAILABLE", StringComparison.Ordinal);

    private static void Summary(StringBuilder sb, AnalysisReport r)
    {
        Open(sb, "summary", "Summary");
        var m = r.Margins;
        Table(sb, ["figure", "value"], [
            ["plant", r.PlantModel + (r.ControlScheme is { } cs ? ", " + cs : "")],
            ["small-signal model", r.SmallSignalModel ?? "not analysed"],
            ["crossover", Q(m?.CrossoverHz, "Hz")],
            ["phase margin", Deg(m?.PhaseMarginDeg)],
            ["gain margin", Db(m?.UpperGainMarginDb)],
            ["lower gain margin", m?.LowerGainMarginDb is null ? "none (not conditionally stable)" : Db(m.LowerGainMarginDb)],
            ["closed loop", m is null ? "not analysed" : m.ClosedLoopStable ? "stable (closed-loop poles in the left half plane)" : "UNSTABLE"],
            ["gain crossovers", m is null ? "-" : m.GainCrossovers.Length.ToString(Inv) + (m.MultipleCrossovers ? " (several: flagged)" : "")],
        ]);
        Close(sb);
    }

    private static void Inputs(StringBuilder sb, LoopDesign design)
    {
        Open(sb, "inputs", "Inputs");
        sb.Append("<p class=\"caption\">Every field of the design file, by its JSON path (docs/design-file.md).</p>\n");
        var rows = new List<string[]>();
        using (var doc = JsonDocument.Parse(DesignFile.Write(design)))
        {
            Flatten(doc.RootElement, "$", rows);
        }

        Table(sb, ["field", "value"], rows, split: true, cls: "inputs");
        Close(sb);
    }

    private static void Flatten(JsonElement e, string path, List<string[]> rows)
    {
        switch (e.ValueKind)
        {
            case JsonValueKind.Object:
                foreach (var p in e.EnumerateObject())
                {
                    Flatten(p.Value, path + "." + p.Name, rows);
                }

                break;
            case JsonValueKind.Array:
                int i = 0;
                foreach (var item in e.EnumerateArray())
                {
                    Flatten(item, path + "[" + i.ToString(Inv) + "]", rows);
                    i++;
                }

                if (i == 0)
                {
                    rows.Add([path, "(none)"]);
                }

                break;
            case JsonValueKind.String:
                rows.Add([path, e.GetString() ?? ""]);
                break;
            default:
                rows.Add([path, e.GetRawText()]);
                break;
        }
    }

    private static void OperatingPoint(StringBuilder sb, OperatingPointReport? op)
    {
        if (op is null)
        {
            return;
        }

        Open(sb, "operating-point", "Operating point");
        Table(sb, ["figure", "value"], [
            ["input voltage", Q(op.InputVoltageV, "V")],
            ["load current", Q(op.LoadCurrentA, "A")],
            ["conduction mode", op.ConductionMode],
            ["duty cycle (with losses)", F(op.DutyCycle, "F4")],
            ["ideal duty cycle Vout/Vin", F(op.IdealDutyCycle, "F4")],
            ["ripple current", Q(op.RippleCurrentApp, "A") + " p-p" + (op.RippleFractionOfFullLoad is double rf ? string.Create(Inv, $" ({rf * 100:F1} % of full load)") : "")],
            ["peak / valley inductor current", Q(op.PeakInductorCurrentA, "A") + " / " + Q(op.ValleyInductorCurrentA, "A")],
            ["output ripple", Q(op.OutputRippleVpp, "V") + " p-p"],
            ["DCM boundary load", Q(op.BoundaryLoadCurrentA, "A")],
        ]);
        Close(sb);
    }

    private static void Bode(StringBuilder sb, DesignAnalysis a, MarginsReport? m)
    {
        if (a.LoopResponse is not FrequencyResponse t)
        {
            return;
        }

        Open(sb, "bode", "Loop gain (Bode)");
        var markers = m?.CrossoverHz is double fc ? new List<(double, string)> { (fc, "fc " + EngineeringFormat.Format(fc, "Hz")) } : [];
        var mag = new List<ChartSeries> { new("T loop gain", "#1f5fa8", t.FrequencyHz, t.MagnitudeDb) };
        if (a.PlantResponse is { } p)
        {
            mag.Add(new("plant", "#6b8e23", p.FrequencyHz, p.MagnitudeDb, Dashed: true));
        }

        if (a.CompensatorResponse is { } c)
        {
            mag.Add(new("compensator", "#a0522d", c.FrequencyHz, c.MagnitudeDb, Dashed: true));
        }

        sb.Append("<figure class=\"chart-box\">").Append(SvgChart.Render("Loop gain magnitude", mag, logX: true, "Hz", "magnitude (dB)", markers));
        sb.Append(SvgChart.Render("Loop gain phase", [new("T phase (continuous)", "#1f5fa8", t.FrequencyHz, t.PhaseDeg)], logX: true, "Hz", "phase (deg)", markers));
        sb.Append("<figcaption>Loop gain T with the amplifier's inversion taken out; margins against -180 degrees (continuous phase).</figcaption></figure>\n");
        if (m is not null)
        {
            Table(sb, ["gain crossover", "phase", "phase margin", "direction"], m.GainCrossovers.Select(g => new[] { Q(g.FrequencyHz, "Hz"), Deg(g.PhaseDeg), Deg(g.PhaseMarginDeg), g.Falling ? "falling" : "rising" }).ToList(), empty: "no gain crossover in the analysed range");
            Table(sb, ["phase crossover", "level", "|T|", "gain margin"], m.PhaseCrossovers.Select(x => new[] { Q(x.FrequencyHz, "Hz"), Deg(x.CriticalPhaseDeg), Db(x.MagnitudeDb), Db(x.GainMarginDb) }).ToList(), empty: "no phase crossover in the analysed range");
        }

        Close(sb);
    }

    private static void Steps(StringBuilder sb, DesignAnalysis a, AnalysisReport r)
    {
        if (a.ReferenceStep is null && a.LoadStep is null)
        {
            return;
        }

        Open(sb, "steps", "Closed-loop steps");
        var rows = new List<string[]>();
        if (a.ReferenceStep is { } rs && r.ReferenceStep is { } rr)
        {
            sb.Append("<figure class=\"chart-box\">").Append(SvgChart.Render("Reference step", [new("output after a " + Q(rr.StepV, "V") + " reference step", "#1f5fa8", rs.TimeS, rs.Value)], logX: false, "s", "output change (V)"));
            sb.Append("</figure>\n");
            rows.Add(["reference step " + Q(rr.StepV, "V"), Pct(rr.OvershootPct), Q(rr.RiseTimeS, "s"), Q(rr.SettlingTimeS, "s"), Q(rr.PeakDeviationV, "V")]);
        }

        if (a.LoadStep is { } ls && r.LoadStep is { } lr)
        {
            sb.Append("<figure class=\"chart-box\">").Append(SvgChart.Render("Load step", [new("output deviation after a " + Q(lr.StepA, "A") + " load step", "#a0522d", ls.TimeS, ls.Value)], logX: false, "s", "output deviation (V)"));
            sb.Append("</figure>\n");
            rows.Add(["load step " + Q(lr.StepA, "A"), Pct(lr.OvershootPct), Q(lr.RiseTimeS, "s"), Q(lr.SettlingTimeS, "s"), Q(lr.PeakDeviationV, "V")]);
        }

        Table(sb, ["step", "overshoot", "rise time", "settling (2 %)", "peak deviation"], rows);
        Close(sb);
    }

    private static void Corners(StringBuilder sb, AnalysisReport r)
    {
        if (r.Corners.IsEmpty)
        {
            return;
        }

        Open(sb, "corners", "Corners of the input and load ranges");
        Table(sb, ["input", "load", "Vin", "Iload", "mode", "model", "D", "fc", "PM", "GM", "closed loop", "note"], r.Corners.Select(c => new[]
        {
            c.Input, c.Load, Q(c.InputVoltageV, "V"), Q(c.LoadCurrentA, "A"), c.ConductionMode, c.Model ?? "none", F(c.DutyCycle, "F3"),
            Q(c.CrossoverHz, "Hz"), Deg(c.PhaseMarginDeg), Db(c.GainMarginDb), c.ClosedLoopStable is bool s ? (s ? "stable" : "UNSTABLE") : "-", c.Note ?? "",
        }).ToList(), cls: "corners");
        Close(sb);
    }

    private static void Criteria(StringBuilder sb, AnalysisReport r)
    {
        Open(sb, "criteria", "Design criteria");
        Table(sb, ["criterion", "actual", "limit", "result"], r.Criteria.Select(c => new[] { c.Name, c.Actual, c.Limit, c.Passed ? "pass" : "FAIL" }).ToList(), empty: "not checked: the design was not analysed");
        Close(sb);
    }

    private static void Parts(StringBuilder sb, LoopDesign design, bool valid)
    {
        Open(sb, "parts", "Parts list");
        var parts = valid ? ReportParts.Of(design) : new ReportParts([], "No parts list: the design has input errors.");
        sb.Append("<p class=\"caption\">").Append(E(parts.Caption)).Append("</p>\n");
        if (!parts.Entries.IsEmpty)
        {
            Table(sb, ["designator", "value", "series", "tolerance", "role"], parts.Entries.Select(p => new[] { p.Designator, EngineeringFormat.Format(p.Value, p.Unit == "Ohm" ? "Ω" : "F", 3), p.Series?.ToString() ?? "-", string.Create(Inv, $"±{p.TolerancePct:G3} %"), p.Role }).ToList());
        }

        Close(sb);
    }

    private static void Findings(StringBuilder sb, AnalysisReport r)
    {
        Open(sb, "warnings", "Warnings and findings");
        if (r.Warnings.IsEmpty && r.Issues.IsEmpty)
        {
            sb.Append("<p>None.</p>\n");
        }

        if (!r.Warnings.IsEmpty)
        {
            sb.Append("<ul class=\"warnings\">");
            foreach (var w in r.Warnings)
            {
                sb.Append("<li").Append(IsHazard(w) ? " class=\"hazard-item\"" : "").Append('>').Append(E(w)).Append("</li>");
            }

            sb.Append("</ul>\n");
        }

        if (!r.Issues.IsEmpty)
        {
            Table(sb, ["severity", "field", "message"], r.Issues.Select(i => new[] { i.Severity, i.Path, i.Message }).ToList());
        }

        Close(sb);
    }

    private static void Open(StringBuilder sb, string id, string title) => sb.Append("<section id=\"").Append(id).Append("\">\n<h2>").Append(E(title)).Append("</h2>\n");

    private static void Close(StringBuilder sb) => sb.Append("</section>\n");

    /// <summary>A table; short tables are kept whole on a page, long ones (split) break between rows and repeat their head.</summary>
    private static void Table(StringBuilder sb, string[] head, List<string[]> rows, bool split = false, string? cls = null, string? empty = null)
    {
        if (rows.Count == 0)
        {
            if (empty is not null)
            {
                sb.Append("<p class=\"caption\">").Append(E(empty)).Append("</p>\n");
            }

            return;
        }

        sb.Append("<table class=\"").Append(split || rows.Count > 25 ? "split" : "keep").Append(cls is null ? "" : " " + cls).Append("\"><thead><tr>");
        foreach (var h in head)
        {
            sb.Append("<th>").Append(E(h)).Append("</th>");
        }

        sb.Append("</tr></thead><tbody>");
        foreach (var row in rows)
        {
            sb.Append("<tr>");
            foreach (var cell in row)
            {
                sb.Append("<td>").Append(E(cell)).Append("</td>");
            }

            sb.Append("</tr>");
        }

        sb.Append("</tbody></table>\n");
    }

    private static string Style(PaperSize paper) => """
        :root { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; color: #111; }
        body { max-width: 190mm; margin: 1.5em auto; font-size: 10.5pt; line-height: 1.35; }
        h1 { font-size: 18pt; margin: 0 0 .2em; }
        h2 { font-size: 13pt; border-bottom: 1px solid #999; margin: 1.2em 0 .4em; break-after: avoid; page-break-after: avoid; }
        .meta, .caption, figcaption { color: #444; font-size: 9pt; }
        .verdict { font-weight: bold; padding: .3em .6em; display: inline-block; border: 1px solid; }
        .verdict.pass { color: #135e13; } .verdict.fail { color: #9a1010; }
        .notice { border: 2px solid #333; padding: .5em .7em; background: #f4f4f4; }
        .hazard { border: 2px solid #9a1010; color: #9a1010; padding: .5em .7em; font-weight: bold; }
        .hazard-item { color: #9a1010; font-weight: bold; }
        table { border-collapse: collapse; width: 100%; margin: .4em 0 .8em; font-size: 9pt; }
        th, td { border: 1px solid #bbb; padding: 2px 5px; text-align: left; vertical-align: top; }
        th { background: #eee; }
        table.inputs td:first-child { font-family: "DejaVu Sans Mono", monospace; font-size: 8pt; }
        table.corners { font-size: 8pt; }
        figure.chart-box { margin: .4em 0; }
        svg.chart { width: 100%; height: auto; display: block; font-family: inherit; }
        .report-foot { margin-top: 2em; border-top: 1px solid #999; color: #444; font-size: 8.5pt; }
        @media print {
          body { max-width: none; margin: 0; }
          table.keep, figure.chart-box, .notice, .hazard, svg.chart { break-inside: avoid; page-break-inside: avoid; }
          table.split tr { break-inside: avoid; page-break-inside: avoid; }
          thead { display: table-header-group; }
          section#bode, section#steps { break-before: page; page-break-before: always; }
          a { color: inherit; text-decoration: none; }
        }

        """ + (paper == PaperSize.A4 ? "@page { size: A4; margin: 14mm 12mm 16mm; }\n" : "@page { size: letter; margin: 0.55in 0.5in 0.65in; }\n");

    private static string E(string s) => WebUtility.HtmlEncode(s);

    private static string Q(double? v, string unit) => v is double x ? EngineeringFormat.Format(x, unit, 3) : "none";

    private static string Deg(double? v) => v is double x ? string.Create(Inv, $"{x:F1} deg") : "none in range";

    private static string Db(double? v) => v is double x ? string.Create(Inv, $"{x:F2} dB") : "none in range";

    private static string Pct(double? v) => v is double x ? string.Create(Inv, $"{x:F1} %") : "none";

    private static string F(double? v, string format) => v is double x ? x.ToString(format, Inv) : "none";
}
