using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;
using YAxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Two designs on the same axes: the loop gain T of each (magnitude over phase, one log frequency axis) and the
/// load-step and reference-step responses of each. A is drawn solid blue, B dashed vermillion (Okabe-Ito, see
/// <see cref="ChartPalette"/>), so the two also read apart in black and white.
/// </summary>
public static class CompareFigure
{
    /// <summary>Colour of design A.</summary>
    public const string ColorA = ChartPalette.Loop;

    /// <summary>Colour of design B.</summary>
    public const string ColorB = ChartPalette.Margin;

    /// <summary>Both loop gains.</summary>
    public static ChartFigure Bode(DesignAnalysis a, string labelA, DesignAnalysis b, string labelB)
    {
        var data = new List<ITrace>();
        AddLoop(data, a, labelA, ColorA, "solid");
        AddLoop(data, b, labelB, ColorB, "dash");
        double start = Math.Min(a.Design.Analysis.StartHz, b.Design.Analysis.StartHz);
        double stop = Math.Max(a.Design.Analysis.StopHz, b.Design.Analysis.StopHz);
        var layout = Base();
        layout.XAxis = [BodeAxes.Frequency(start, stop)];
        layout.YAxis =
        [
            new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "|T| (dB)" }, Domain = [0.53m, 1m], GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True, ZeroLineColor = ChartPalette.Ink },
            new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "phase of T (deg)" }, Domain = [0m, 0.47m], GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True, DTick = 45 },
        ];
        layout.UiRevision = "compare-bode";
        return new ChartFigure(data, layout, []);
    }

    /// <summary>Both designs' load-step (left) and reference-step (right) responses.</summary>
    public static ChartFigure Steps(DesignAnalysis a, string labelA, DesignAnalysis b, string labelB)
    {
        var data = new List<ITrace>();
        AddStep(data, a.LoadStep, labelA + ": load step", ColorA, "solid", "x", "y");
        AddStep(data, b.LoadStep, labelB + ": load step", ColorB, "dash", "x", "y");
        AddStep(data, a.ReferenceStep, labelA + ": reference step", ColorA, "solid", "x2", "y2");
        AddStep(data, b.ReferenceStep, labelB + ": reference step", ColorB, "dash", "x2", "y2");
        var layout = Base();
        layout.XAxis = [TimeAxis("y", [0m, 0.46m]), TimeAxis("y2", [0.56m, 1m])];
        layout.YAxis =
        [
            new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "load step (V)" }, Anchor = "x", ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True },
            new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new YAxisTitle { Text = "reference step (V)" }, Anchor = "x2", ExponentFormat = Plotly.Blazor.LayoutLib.YAxisLib.ExponentFormatEnum.SI, GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True },
        ];
        layout.UiRevision = "compare-steps";
        return new ChartFigure(data, layout, []);
    }

    private static void AddLoop(List<ITrace> data, DesignAnalysis analysis, string label, string color, string dash)
    {
        if (analysis.LoopResponse is not FrequencyResponse r)
        {
            return;
        }

        var mag = ChartNumbers.Simplified(r.FrequencyHz, r.MagnitudeDb, BodeFigure.MagnitudeToleranceDb, logX: true, BodeFigure.MaxPoints, 1e-3);
        var phase = ChartNumbers.Simplified(r.FrequencyHz, r.PhaseDeg, BodeFigure.PhaseToleranceDeg, logX: true, BodeFigure.MaxPoints, 1e-3);
        data.Add(new Scatter { Name = label, LegendGroup = label, Mode = ModeFlag.Lines, X = mag.X, Y = mag.Y, XAxis = "x", YAxis = "y", Line = new Line { Color = color, Width = 2.6m, Dash = dash }, HoverTemplate = label + ": %{y:.1f} dB at %{x:.4s}Hz<extra></extra>" });
        data.Add(new Scatter { Name = label + " phase", LegendGroup = label, ShowLegend = false, Mode = ModeFlag.Lines, X = phase.X, Y = phase.Y, XAxis = "x", YAxis = "y2", Line = new Line { Color = color, Width = 2.6m, Dash = dash }, HoverTemplate = label + ": %{y:.1f}° at %{x:.4s}Hz<extra></extra>" });
    }

    private static void AddStep(List<ITrace> data, StepResponse? r, string name, string color, string dash, string x, string y)
    {
        if (r is null)
        {
            return;
        }

        var series = ChartNumbers.Simplified(r.TimeS, r.Value, ChartNumbers.TimeTolerance(r.Value), logX: false, StepFigure.MaxPoints);
        data.Add(new Scatter { Name = name, Mode = ModeFlag.Lines, X = series.X, Y = series.Y, XAxis = x, YAxis = y, Line = new Line { Color = color, Width = 2.4m, Dash = dash }, HoverTemplate = name + ": %{y:.4s}V at %{x:.4s}s<extra></extra>" });
    }

    private static Layout Base() => new()
    {
        Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
        PaperBgColor = "#ffffff",
        PlotBgColor = "#ffffff",
        Margin = new Margin { L = 78, R = 24, T = 40, B = 58 },
        ShowLegend = true,
        Legend = [new Legend { Orientation = Plotly.Blazor.LayoutLib.LegendLib.OrientationEnum.H, X = 0m, Y = 1.12m }],
        HoverMode = HoverModeEnum.Closest,
    };

    private static XAxis TimeAxis(string anchor, IList<object> domain) => new()
    {
        TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow,
        Title = new XAxisTitle { Text = "time (s)" },
        Domain = domain,
        Anchor = anchor,
        ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI,
        GridColor = ChartPalette.Grid,
        ShowLine = true,
        LineColor = ChartPalette.Ink,
        Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True,
        ZeroLine = false,
    };
}
