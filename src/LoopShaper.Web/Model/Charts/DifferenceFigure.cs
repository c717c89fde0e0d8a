using LoopShaper.Core.Measurements;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>Measured minus model: gain difference in dB over phase difference in degrees, on one log frequency axis (numbers from the core's <see cref="ResponseDifference"/>).</summary>
public static class DifferenceFigure
{
    /// <summary>Gain-difference trace name.</summary>
    public const string GainName = "gain, measured − model";

    /// <summary>Phase-difference trace name.</summary>
    public const string PhaseName = "phase, measured − model";

    /// <summary>Builds the figure of a comparison.</summary>
    public static ChartFigure Build(MeasurementComparison comparison)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        var d = comparison.Difference;
        var gain = ChartNumbers.Thinned(d.FrequencyHz, d.GainDb, BodeFigure.MaxPoints, 1e-3);
        var phase = ChartNumbers.Thinned(d.FrequencyHz, d.PhaseDeg, BodeFigure.MaxPoints, 1e-3);
        var data = new List<ITrace>
        {
            new Scatter { Name = GainName, Mode = ModeFlag.Lines | ModeFlag.Markers, X = gain.X, Y = gain.Y, XAxis = "x", YAxis = "y", Line = new Line { Color = ChartPalette.Loop, Width = 2m }, Marker = new Marker { Size = 4 }, HoverTemplate = "%{y:.2f} dB at %{x:.4s}Hz<extra></extra>" },
            new Scatter { Name = PhaseName, Mode = ModeFlag.Lines | ModeFlag.Markers, X = phase.X, Y = phase.Y, XAxis = "x", YAxis = "y2", Line = new Line { Color = ChartPalette.Margin, Width = 2m }, Marker = new Marker { Size = 4 }, HoverTemplate = "%{y:.2f}° at %{x:.4s}Hz<extra></extra>" },
        };
        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 78, R = 24, T = 14, B = 58 },
            ShowLegend = false,
            UiRevision = "difference",
            XAxis = [new XAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow, Type = Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Log, Title = new XAxisTitle { Text = "frequency (Hz)" }, ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI, Anchor = "y2", GridColor = ChartPalette.Grid, ShowLine = true, LineColor = ChartPalette.Ink }],
            YAxis =
            [
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new AxisTitle { Text = "Δ gain (dB)" }, Domain = [0.53m, 1m], Range = RangeOf(d.GainDb, 2.0), GridColor = ChartPalette.Grid, ZeroLineColor = ChartPalette.Ink, ShowLine = true, LineColor = ChartPalette.Ink },
                new YAxis { TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow, Title = new AxisTitle { Text = "Δ phase (deg)" }, Domain = [0m, 0.47m], Range = RangeOf(d.PhaseDeg, 10.0), GridColor = ChartPalette.Grid, ZeroLineColor = ChartPalette.Ink, ShowLine = true, LineColor = ChartPalette.Ink },
            ],
        };
        return new ChartFigure(data, layout, []);
    }

    /// <summary>An axis range holding zero and every value, at least <paramref name="minSpan"/> wide, so that round-off never fills the panel.</summary>
    private static object[] RangeOf(IEnumerable<double> values, double minSpan)
    {
        var (lo, hi) = ChartNumbers.Extent(values.Append(0.0), -minSpan / 2, minSpan / 2);
        double pad = Math.Max((minSpan - (hi - lo)) / 2, 0) + (0.05 * (hi - lo));
        return [lo - pad, hi + pad];
    }
}
