using LoopShaper.Core.Analysis;
using LoopShaper.Core.Corners;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// The loop gain of every corner overlaid, magnitude over phase: corners that pass in thin blue, corners that fail
/// dashed orange, the corner with the smallest phase margin thick vermillion and drawn last (on top), in the order
/// <see cref="CornerTable.OverlayOrder"/> gives.
/// </summary>
public static class CornerBodeFigure
{
    /// <summary>Legend group of passing corners.</summary>
    public const string PassingName = "corners that pass";

    /// <summary>Legend group of failing corners.</summary>
    public const string FailingName = "corners that fail";

    /// <summary>Prefix of the worst corner's trace name.</summary>
    public const string WorstName = "smallest phase margin";

    /// <summary>Most points drawn per corner trace (many corners share the chart).</summary>
    public const int MaxPoints = 240;

    /// <summary>Builds the overlay; <paramref name="startHz"/> and <paramref name="stopHz"/> fix the frequency axis.</summary>
    public static ChartFigure Build(CornerTable table, double startHz, double stopHz)
    {
        var data = new List<ITrace>();
        int? worst = table.Worst.PhaseMargin;
        bool passShown = false, failShown = false;
        var magnitudes = new List<double>();
        var phases = new List<double>();
        foreach (var row in table.OverlayOrder())
        {
            var response = row.LoopResponse!;
            bool isWorst = worst is int w && ReferenceEquals(table.Rows[w], row);
            string group = isWorst ? WorstName : row.Passed ? PassingName : FailingName;
            bool legend = isWorst || (row.Passed ? !passShown : !failShown);
            passShown |= row.Passed && !isWorst;
            failShown |= !row.Passed && !isWorst;
            string name = isWorst ? $"{WorstName}: {row.Corner.Label}" : row.Corner.Label;
            var (color, dash, width) = isWorst ? (ChartPalette.Margin, "solid", 3.4m) : row.Passed ? (ChartPalette.Loop, "solid", 1.3m) : (ChartPalette.Plant, "dash", 1.6m);
            double opacity = isWorst ? 1.0 : 0.55;
            Add(data, response, name, group, isWorst ? name : group, legend, color, dash, width, opacity);
            magnitudes.AddRange(response.MagnitudeDb);
            phases.AddRange(response.PhaseDeg);
        }

        var mag = BodeAxes.MagnitudeRange(magnitudes);
        var phase = BodeAxes.PhaseRange(phases);
        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 78, R = 24, T = 40, B = 58 },
            ShowLegend = true,
            Legend = [new Legend { Orientation = Plotly.Blazor.LayoutLib.LegendLib.OrientationEnum.H, X = 0m, Y = 1.1m, ItemDoubleClick = Plotly.Blazor.LayoutLib.LegendLib.ItemDoubleClickEnum.False, Font = new Plotly.Blazor.LayoutLib.LegendLib.Font { Size = 13 } }],
            HoverMode = HoverModeEnum.Closest,
            UiRevision = "corner-bode",
            XAxis = [BodeAxes.Frequency(startHz, stopHz)],
            YAxis =
            [
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new AxisTitle { Text = "magnitude (dB)" }, Domain = [0.53m, 1m], Range = [mag.Min, mag.Max], DTick = 20, GridColor = ChartPalette.Grid, ZeroLineColor = ChartPalette.Ink, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True },
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new AxisTitle { Text = "phase (deg)" }, Domain = [0m, 0.47m], Range = [phase.Min, phase.Max], DTick = 45, GridColor = ChartPalette.Grid, ZeroLine = false, ShowLine = true, LineColor = ChartPalette.Ink, Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True },
            ],
            Shapes =
            [
                new Shape { Type = Plotly.Blazor.LayoutLib.ShapeLib.TypeEnum.Line, XRef = "paper", X0 = 0m, X1 = 1m, YRef = "y2", Y0 = -180, Y1 = -180, Line = new Plotly.Blazor.LayoutLib.ShapeLib.Line { Color = ChartPalette.Ink, Width = 1.4m, Dash = "dash" }, Layer = Plotly.Blazor.LayoutLib.ShapeLib.LayerEnum.Below },
            ],
        };
        return new ChartFigure(data, layout, []);
    }

    private static void Add(List<ITrace> data, FrequencyResponse r, string name, string group, string legendName, bool legend, string color, string dash, decimal width, double opacity)
    {
        var mag = ChartNumbers.Simplified(r.FrequencyHz, r.MagnitudeDb, 2 * BodeFigure.MagnitudeToleranceDb, logX: true, MaxPoints, 1e-2);
        var phase = ChartNumbers.Simplified(r.FrequencyHz, r.PhaseDeg, 2 * BodeFigure.PhaseToleranceDeg, logX: true, MaxPoints, 1e-2);
        data.Add(new Scatter
        {
            Name = legend ? legendName : name,
            LegendGroup = group,
            ShowLegend = legend,
            Mode = ModeFlag.Lines,
            X = mag.X,
            Y = mag.Y,
            XAxis = "x",
            YAxis = "y",
            Opacity = (decimal)opacity,
            Line = new Line { Color = color, Width = width, Dash = dash },
            HoverTemplate = name + ": %{y:.1f} dB at %{x:.4s}Hz<extra></extra>",
        });
        data.Add(new Scatter
        {
            Name = name + " phase",
            LegendGroup = group,
            ShowLegend = false,
            Mode = ModeFlag.Lines,
            X = phase.X,
            Y = phase.Y,
            XAxis = "x",
            YAxis = "y2",
            Opacity = (decimal)opacity,
            Line = new Line { Color = color, Width = width, Dash = dash },
            HoverTemplate = name + ": %{y:.1f}° at %{x:.4s}Hz<extra></extra>",
        });
    }
}
