using LoopShaper.Core.Loop;
using LoopShaper.Core.Units;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AnnotationFont = Plotly.Blazor.LayoutLib.AnnotationLib.Font;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;
using YAxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// The closed-loop transients side by side: load step (with its slew), reference step and line step, each with its peak
/// deviation marked and the recovery band and recovery time as the core's <see cref="Transient"/> gives them.
/// </summary>
public static class TransientFigure
{
    /// <summary>Load-step trace name.</summary>
    public const string LoadName = "load step";

    /// <summary>Reference-step trace name.</summary>
    public const string ReferenceName = "reference step";

    /// <summary>Line-step trace name.</summary>
    public const string LineName = "line step";

    /// <summary>Most points drawn per transient.</summary>
    public const int MaxPoints = 400;

    /// <summary>Builds the figure of a closed-loop performance record (null: nothing to draw yet).</summary>
    public static ChartFigure Build(ClosedLoopPerformance? p)
    {
        var data = new List<ITrace>();
        var notes = new List<Annotation>();
        var panels = new (string Name, Transient? T, string Unit, string YTitle, string Missing)[]
        {
            (LoadName, p?.LoadStep, "A", "output deviation (V)", "no load step for this plant"),
            (ReferenceName, p?.ReferenceStep, "V", "output change (V)", "no reference step"),
            (LineName, p?.LineStep, "V", "output deviation (V)", "no line step for this plant"),
        };
        var xAxes = new List<XAxis>();
        var yAxes = new List<YAxis>();
        for (int k = 0; k < panels.Length; k++)
        {
            var (name, t, unit, yTitle, missing) = panels[k];
            string x = k == 0 ? "x" : "x" + (k + 1), y = k == 0 ? "y" : "y" + (k + 1);
            decimal left = k * 0.355m, right = left + 0.29m;
            xAxes.Add(new XAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow, Title = new XAxisTitle { Text = "time (s)" }, Domain = [left, right], Anchor = y, ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True, ZeroLine = false });
            yAxes.Add(new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = yTitle }, Anchor = x, ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True, ZeroLineColor = "#9aa4ae" });
            if (t is null || t.Response.TimeS.Length < 2)
            {
                notes.Add(Note(x + " domain", y + " domain", 0.5m, 0.5m, missing, ChartPalette.Margin));
                continue;
            }

            string title = $"{name} {EngineeringFormat.Format(t.StepSize, unit)}" + (t.RiseTimeS > 0 ? $" in {EngineeringFormat.Format(t.RiseTimeS, "s")}" : string.Empty);
            var series = ChartNumbers.Simplified(t.Response.TimeS, t.Response.Value, ChartNumbers.TimeTolerance(t.Response.Value), logX: false, MaxPoints);
            data.Add(new Scatter
            {
                Name = title,
                Mode = ModeFlag.Lines,
                X = series.X,
                Y = series.Y,
                XAxis = x,
                YAxis = y,
                Line = new Line { Color = k == 1 ? ChartPalette.Compensator : ChartPalette.Loop, Width = 2.6m },
                HoverTemplate = name + ": %{y:.4s}V at %{x:.4s}s<extra></extra>",
            });
            notes.Add(new Annotation { XRef = x + " domain", YRef = y + " domain", X = 0.5m, Y = 1.0m, YAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.YAnchorEnum.Bottom, ShowArrow = false, Text = "<b>" + title + "</b>", Font = new AnnotationFont { Size = 13.5m, Color = ChartPalette.Ink } });

            double final = t.FinalValueV ?? 0.0;
            double t0 = t.Response.TimeS[0], t1 = t.Response.TimeS[^1];
            if (t.FinalValueV is double fv && double.IsFinite(fv) && double.IsFinite(t.RecoveryBand) && t.RecoveryBand > 0)
            {
                data.Add(new Scatter
                {
                    Name = "recovery band",
                    Mode = ModeFlag.Lines,
                    X = [t0, t1, null, t0, t1],
                    Y = [fv + t.RecoveryBand, fv + t.RecoveryBand, null, fv - t.RecoveryBand, fv - t.RecoveryBand],
                    XAxis = x,
                    YAxis = y,
                    Line = new Line { Color = "#6b7682", Width = 1.2m, Dash = "dot" },
                    HoverInfo = HoverInfoFlag.Skip,
                });
            }

            // The reference step is judged by its overshoot (the core's StepMetrics peak); the disturbances by their
            // largest deviation from the final value (the core's Transient peak).
            bool isReference = k == 1;
            double peakT = isReference ? t.Response.Metrics.PeakTimeS : t.PeakTimeS;
            double peakY = isReference ? t.Response.Metrics.PeakDeviation : final + t.PeakDeviationV;
            string peakText = isReference
                ? t.Response.Metrics.OvershootPct is double os ? $"overshoot {os.ToString("F1", System.Globalization.CultureInfo.InvariantCulture)} %" : "peak " + Signed(peakY)
                : "peak " + Signed(t.PeakDeviationV);
            if (double.IsFinite(peakT) && double.IsFinite(peakY))
            {
                data.Add(new Scatter { Name = "peak", Mode = ModeFlag.Markers, X = [peakT], Y = [peakY], XAxis = x, YAxis = y, Marker = new Marker { Size = 10, Color = ChartPalette.Margin }, HoverInfo = HoverInfoFlag.Skip });
                notes.Add(Callout.Beside(
                    new Annotation
                    {
                        XRef = x,
                        YRef = y,
                        X = peakT,
                        Y = peakY,
                        Text = peakText,
                        BgColor = "rgba(255,255,255,0.92)",
                        BorderColor = ChartPalette.Margin,
                        BorderWidth = 1.2m,
                        BorderPad = 2m,
                        Font = new AnnotationFont { Size = 12.5m, Color = ChartPalette.Ink },
                    },
                    right: true,
                    above: peakY >= final));
            }

            if (t.RecoveryTimeS is double rt && double.IsFinite(rt))
            {
                var (lo, hi) = ChartNumbers.Extent(t.Response.Value, -1, 1);
                data.Add(new Scatter { Name = "recovered", Mode = ModeFlag.Lines, X = [rt, rt], Y = [lo, hi], XAxis = x, YAxis = y, Line = new Line { Color = ChartPalette.GainMargin, Width = 1.6m, Dash = "dash" }, HoverInfo = HoverInfoFlag.Skip });
                notes.Add(Note(x + " domain", y + " domain", 0.98m, peakY < final ? 0.92m : 0.08m, $"recovered {EngineeringFormat.Format(rt, "s")} (±{EngineeringFormat.Format(t.RecoveryBand, "V")})", ChartPalette.GainMargin, right: true));
            }
            else
            {
                notes.Add(Note(x + " domain", y + " domain", 0.98m, peakY < final ? 0.92m : 0.08m, "not recovered in the simulated time", ChartPalette.Margin, right: true));
            }
        }

        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 70, R = 14, T = 34, B = 56 },
            ShowLegend = false,
            HoverMode = HoverModeEnum.Closest,
            UiRevision = "transients",
            XAxis = xAxes,
            YAxis = yAxes,
            Annotations = notes,
        };
        return new ChartFigure(data, layout, []);
    }

    private static Annotation Note(string xRef, string yRef, decimal x, decimal y, string text, string color, bool right = false) => new()
    {
        XRef = xRef,
        YRef = yRef,
        X = x,
        Y = y,
        XAnchor = right ? Plotly.Blazor.LayoutLib.AnnotationLib.XAnchorEnum.Right : Plotly.Blazor.LayoutLib.AnnotationLib.XAnchorEnum.Center,
        ShowArrow = false,
        Text = text,
        Font = new AnnotationFont { Color = color, Size = 12.5m },
    };

    private static string Signed(double v) => (v < 0 ? "\u2212" : "+") + EngineeringFormat.Format(Math.Abs(v), "V");
}
