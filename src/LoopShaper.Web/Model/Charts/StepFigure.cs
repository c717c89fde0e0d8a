using System.Globalization;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
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
/// The closed-loop step responses side by side: output deviation after the load step, output after the reference
/// step, each with its peak (overshoot) and its 2 % settling time marked, as the core's <see cref="StepMetrics"/> give them.
/// </summary>
public static class StepFigure
{
    /// <summary>Load-step trace name.</summary>
    public const string LoadName = "load step";

    /// <summary>Reference-step trace name.</summary>
    public const string ReferenceName = "reference step";

    /// <summary>Most points drawn per response; longer ones are thinned keeping each bucket's extremes.</summary>
    public const int MaxPoints = 400;

    /// <summary>Builds the figure of an analysis.</summary>
    public static ChartFigure Build(DesignAnalysis analysis)
    {
        var data = new List<ITrace>();
        var notes = new List<Annotation>();
        var a = analysis.Design.Analysis;
        if (analysis.LoadStep is StepResponse load)
        {
            AddStep(data, notes, load, "x", "y", LoadName + $" {EngineeringFormat.Format(a.LoadStepA, "A")}", ChartPalette.Loop, isLoad: true);
        }
        else
        {
            notes.Add(Centered("x domain", "y domain", "no load step for this plant"));
        }

        if (analysis.ReferenceStep is StepResponse reference)
        {
            AddStep(data, notes, reference, "x2", "y2", ReferenceName + $" {EngineeringFormat.Format(a.ReferenceStepV, "V")}", ChartPalette.Compensator, isLoad: false);
        }

        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 76, R = 20, T = 36, B = 58 },
            ShowLegend = false,
            HoverMode = HoverModeEnum.Closest,
            XAxis = [Axis("x", [0m, 0.46m]), Axis("x2", [0.56m, 1m])],
            YAxis =
            [
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "output deviation (V)" }, Anchor = "x", ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True, ZeroLineColor = "#9aa4ae" },
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "output change (V)" }, Anchor = "x2", ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True, ZeroLineColor = "#9aa4ae" },
            ],
            Annotations = notes,
            UiRevision = "steps",
        };
        return new ChartFigure(data, layout, []);
    }

    private static void AddStep(List<ITrace> data, List<Annotation> notes, StepResponse r, string x, string y, string name, string color, bool isLoad)
    {
        var series = ChartNumbers.Simplified(r.TimeS, r.Value, ChartNumbers.TimeTolerance(r.Value), logX: false, MaxPoints);
        data.Add(new Scatter
        {
            Name = name,
            Mode = ModeFlag.Lines,
            X = series.X,
            Y = series.Y,
            XAxis = x,
            YAxis = y,
            Line = new Line { Color = color, Width = 2.8m },
            HoverTemplate = name + ": %{y:.4s}V at %{x:.4s}s<extra></extra>",
        });
        notes.Add(new Annotation { XRef = x + " domain", YRef = y + " domain", X = 0.5m, Y = 1.0m, YAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.YAnchorEnum.Bottom, ShowArrow = false, Text = "<b>" + name + "</b>", Font = new AnnotationFont { Size = 15, Color = ChartPalette.Ink } });

        var m = r.Metrics;
        if (double.IsFinite(m.PeakTimeS) && double.IsFinite(m.PeakDeviation))
        {
            data.Add(Marker(m.PeakTimeS, m.PeakDeviation, x, y, ChartPalette.Margin, "peak"));
            string text = isLoad
                ? $"peak {Signed(m.PeakDeviation, "V")}"
                : m.OvershootPct is double os ? $"overshoot {os.ToString("F1", CultureInfo.InvariantCulture)} %" : $"peak {Signed(m.PeakDeviation, "V")}";
            notes.Add(Callout.Beside(
                new Annotation
                {
                    XRef = x,
                    YRef = y,
                    X = m.PeakTimeS,
                    Y = m.PeakDeviation,
                    Text = text,
                    BgColor = "rgba(255,255,255,0.92)",
                    BorderColor = ChartPalette.Margin,
                    BorderWidth = 1.5m,
                    BorderPad = 3m,
                },
                right: true,
                above: m.PeakDeviation >= 0));
        }

        if (m.SettlingTimeS is double ts && double.IsFinite(ts) && r.TimeS.Length > 0)
        {
            var (lo, hi) = ChartNumbers.Extent(r.Value, -1, 1);
            data.Add(new Scatter
            {
                Name = "settling",
                Mode = ModeFlag.Lines,
                X = [ts, ts],
                Y = [lo, hi],
                XAxis = x,
                YAxis = y,
                Line = new Line { Color = ChartPalette.GainMargin, Width = 1.6m, Dash = "dash" },
                HoverInfo = HoverInfoFlag.Skip,
            });
            notes.Add(new Annotation
            {
                XRef = x,
                YRef = y + " domain",
                X = ts,
                Y = 0.04m,
                XAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.XAnchorEnum.Left,
                Text = $"settled (2 %) {EngineeringFormat.Format(ts, "s")}",
                ShowArrow = false,
                XShift = 4,
                Font = new AnnotationFont { Color = ChartPalette.GainMargin, Size = 13 },
            });
        }
        else if (m.SettlingTimeS is null)
        {
            notes.Add(Centered(x + " domain", y + " domain", "not settled within the simulated time"));
        }

        if (m.FinalValue is double final && double.IsFinite(final) && r.TimeS.Length > 1)
        {
            data.Add(new Scatter
            {
                Name = "final value",
                Mode = ModeFlag.Lines,
                X = [r.TimeS[0], r.TimeS[^1]],
                Y = [final, final],
                XAxis = x,
                YAxis = y,
                Line = new Line { Color = "#6b7682", Width = 1.2m, Dash = "dot" },
                HoverInfo = HoverInfoFlag.Skip,
            });
        }
    }

    private static Scatter Marker(double t, double v, string x, string y, string color, string name) => new()
    {
        Name = name,
        Mode = ModeFlag.Markers,
        X = [t],
        Y = [v],
        XAxis = x,
        YAxis = y,
        Marker = new Plotly.Blazor.Traces.ScatterLib.Marker { Size = 10, Color = color },
        HoverInfo = HoverInfoFlag.Skip,
    };

    private static XAxis Axis(string anchorOf, IList<object> domain) => new()
    {
        TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow,
        Title = new XAxisTitle { Text = "time (s)" },
        Domain = domain,
        Anchor = anchorOf == "x" ? "y" : "y2",
        ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI,
        GridColor = ChartPalette.Grid,
        ShowLine = true,
        LineColor = ChartPalette.Ink,
        Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True,
        ZeroLine = false,
    };

    private static Annotation Centered(string xRef, string yRef, string text) => new()
    {
        XRef = xRef,
        YRef = yRef,
        X = 0.5m,
        Y = 0.5m,
        ShowArrow = false,
        Text = text,
        Font = new AnnotationFont { Color = ChartPalette.Margin, Size = 14 },
    };

    private static string Signed(double v, string unit) => (v < 0 ? "\u2212" : "+") + EngineeringFormat.Format(Math.Abs(v), unit);
}
