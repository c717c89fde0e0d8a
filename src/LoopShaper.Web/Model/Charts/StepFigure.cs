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

    /// <summary>Name of the load-step panel's marks trace (final value, settling time, peak).</summary>
    public const string LoadMarksName = "load-step marks";

    /// <summary>Name of the reference-step panel's marks trace (final value, settling time, peak).</summary>
    public const string ReferenceMarksName = "reference-step marks";

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
                VoltageAxis("output deviation (V)", anchor: "x"),
                VoltageAxis("output change (V)", anchor: "x2"),
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

        // The marks of a panel (ChartMarks): the final value and the settling time as dashed lines, the peak as a dot,
        // their figures as labels (plotly.js redraws three traces far faster than extra traces and annotations).
        var marks = new ChartMarks(isLoad ? LoadMarksName : ReferenceMarksName, x, y, new Line { Color = ChartPalette.Reference, Width = 1.4m, Dash = "dash" });
        var m = r.Metrics;
        if (m.FinalValue is double final && double.IsFinite(final) && r.TimeS.Length > 1)
        {
            marks.Segment(r.TimeS[0], final, r.TimeS[^1], final, "final value");
        }

        if (m.SettlingTimeS is double ts && double.IsFinite(ts) && r.TimeS.Length > 0)
        {
            var (lo, hi) = ChartNumbers.Extent(r.Value, -1, 1);
            marks.Segment(ts, hi, ts, lo, "settling", $"settled (2 %) {EngineeringFormat.Format(ts, "s")}", Plotly.Blazor.Traces.ScatterLib.TextPositionEnum.TopRight);
        }
        else if (m.SettlingTimeS is null)
        {
            notes.Add(Centered(x + " domain", y + " domain", "not settled within the simulated time"));
        }

        if (double.IsFinite(m.PeakTimeS) && double.IsFinite(m.PeakDeviation))
        {
            string text = isLoad
                ? $"peak {Signed(m.PeakDeviation, "V")}"
                : m.OvershootPct is double os ? $"overshoot {os.ToString("F1", CultureInfo.InvariantCulture)} %" : $"peak {Signed(m.PeakDeviation, "V")}";
            marks.Point(m.PeakTimeS, m.PeakDeviation, Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.Circle, 10, ChartPalette.Margin, "peak", text, Callout.Position(right: true, above: m.PeakDeviation >= 0));
        }

        if (!marks.IsEmpty)
        {
            data.AddRange(marks.ToTraces(hoverTemplate: null));
        }
    }

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

    // A step's voltage axis: SI prefixes down to 10^0 (-25m rather than -0.025), as the time axis shows its ticks.
    private static YAxis VoltageAxis(string title, string anchor) => new()
    {
        TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow,
        Title = new YAxisTitle { Text = title },
        Anchor = anchor,
        ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI,
        MinExponent = 0,
        GridColor = ChartPalette.Grid,
        ShowLine = true,
        LineColor = ChartPalette.Ink,
        Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True,
        ZeroLineColor = "#9aa4ae",
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
