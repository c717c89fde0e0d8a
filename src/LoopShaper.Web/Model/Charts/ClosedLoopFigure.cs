using LoopShaper.Core.Analysis;
using LoopShaper.Core.Loop;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AnnotationFont = Plotly.Blazor.LayoutLib.AnnotationLib.Font;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;
using YAxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Closed-loop performance in the frequency domain, two panels side by side: output impedance and line-to-output
/// (audio susceptibility), each open loop (dashed) against closed loop (solid), magnitudes as the core computed them.
/// </summary>
public static class ClosedLoopFigure
{
    /// <summary>Open-loop output impedance trace name.</summary>
    public const string ImpedanceOpenName = "Zout open loop";

    /// <summary>Closed-loop output impedance trace name.</summary>
    public const string ImpedanceClosedName = "Zout closed loop";

    /// <summary>Open-loop line-to-output trace name.</summary>
    public const string LineOpenName = "line to output, open loop";

    /// <summary>Closed-loop line-to-output trace name.</summary>
    public const string LineClosedName = "line to output, closed loop";

    /// <summary>Most points drawn per trace.</summary>
    public const int MaxPoints = 500;

    /// <summary>Builds the figure; <paramref name="startHz"/> and <paramref name="stopHz"/> fix the frequency axes.</summary>
    public static ChartFigure Build(ClosedLoopPerformance? curves, double startHz, double stopHz)
    {
        var data = new List<ITrace>();
        var notes = new List<Annotation>
        {
            Title("x domain", "<b>output impedance</b>"),
            Title("x2 domain", "<b>audio susceptibility</b>"),
        };
        if (curves?.OutputImpedanceOpen is null && curves?.OutputImpedanceClosed is null)
        {
            notes.Add(Centered("x domain", "y domain", "no output impedance for this plant"));
        }

        if (curves?.AudioSusceptibilityOpen is null && curves?.AudioSusceptibilityClosed is null)
        {
            notes.Add(Centered("x2 domain", "y2 domain", "no line-to-output function for this plant"));
        }

        Add(data, curves?.OutputImpedanceOpen, ImpedanceOpenName, "x", "y", ChartPalette.Plant, "dash", 2.4m, "dBΩ");
        Add(data, curves?.OutputImpedanceClosed, ImpedanceClosedName, "x", "y", ChartPalette.Loop, "solid", 3m, "dBΩ");
        Add(data, curves?.AudioSusceptibilityOpen, LineOpenName, "x2", "y2", ChartPalette.Plant, "dash", 2.4m, "dB");
        Add(data, curves?.AudioSusceptibilityClosed, LineClosedName, "x2", "y2", ChartPalette.Loop, "solid", 3m, "dB");

        bool rangeOk = double.IsFinite(startHz) && double.IsFinite(stopHz) && startHz > 0 && stopHz > startHz;
        IList<object>? range = rangeOk ? [Math.Log10(startHz), Math.Log10(stopHz)] : null;
        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 70, R = 16, T = 34, B = 86 },
            ShowLegend = true,
            Legend = [new Legend { Orientation = Plotly.Blazor.LayoutLib.LegendLib.OrientationEnum.H, X = 0m, Y = -0.3m, ItemDoubleClick = Plotly.Blazor.LayoutLib.LegendLib.ItemDoubleClickEnum.False, Font = new Plotly.Blazor.LayoutLib.LegendLib.Font { Size = 13 } }],
            HoverMode = HoverModeEnum.Closest,
            UiRevision = "closed-loop",
            XAxis = [FrequencyAxis("y", [0m, 0.45m], range), FrequencyAxis("y2", [0.57m, 1m], range)],
            YAxis = [LevelAxis("x", "output impedance (dBΩ)"), LevelAxis("x2", "line to output (dB)")],
            Annotations = notes,
        };
        return new ChartFigure(data, layout, []);
    }

    private static void Add(List<ITrace> data, FrequencyResponse? r, string name, string x, string y, string color, string dash, decimal width, string unit)
    {
        if (r is null)
        {
            return;
        }

        var series = ChartNumbers.Simplified(r.FrequencyHz, r.MagnitudeDb, BodeFigure.MagnitudeToleranceDb, logX: true, MaxPoints, 1e-3);
        data.Add(new Scatter
        {
            Name = name,
            Mode = ModeFlag.Lines,
            X = series.X,
            Y = series.Y,
            XAxis = x,
            YAxis = y,
            Line = new Line { Color = color, Width = width, Dash = dash },
            HoverTemplate = name + ": %{y:.1f} " + unit + " at %{x:.4s}Hz<extra></extra>",
        });
    }

    private static XAxis FrequencyAxis(string anchor, IList<object> domain, IList<object>? range) => new()
    {
        TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow,
        Type = Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Log,
        Title = new XAxisTitle { Text = "frequency (Hz)" },
        Domain = domain,
        Range = range,
        Anchor = anchor,
        ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI,
        GridColor = ChartPalette.Grid,
        ShowLine = true,
        LineColor = ChartPalette.Ink,
        Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True,
        Ticks = Plotly.Blazor.LayoutLib.XAxisLib.TicksEnum.Outside,
    };

    private static YAxis LevelAxis(string anchor, string title) => new()
    {
        TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow,
        Title = new YAxisTitle { Text = title },
        Anchor = anchor,
        GridColor = ChartPalette.Grid,
        ShowLine = true,
        LineColor = ChartPalette.Ink,
        Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True,
        ZeroLineColor = "#9aa4ae",
    };

    private static Annotation Title(string xRef, string text) => new()
    {
        XRef = xRef,
        YRef = "paper",
        X = 0.5m,
        Y = 1.0m,
        YAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.YAnchorEnum.Bottom,
        ShowArrow = false,
        Text = text,
        Font = new AnnotationFont { Size = 15, Color = ChartPalette.Ink },
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
}
