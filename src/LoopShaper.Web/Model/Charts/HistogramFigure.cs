using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using AnnotationFont = Plotly.Blazor.LayoutLib.AnnotationLib.Font;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;
using YAxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Monte Carlo histograms side by side: crossover frequency, phase margin and upper gain margin, bins as the core's
/// <see cref="FigureDistribution"/> counted them, each with its design-criterion limit as a dashed line.
/// </summary>
public static class HistogramFigure
{
    /// <summary>The figures shown, in panel order: the core's figure name, the axis title, the hover unit.</summary>
    public static readonly IReadOnlyList<(string Figure, string Title, string Unit)> Panels =
    [
        ("crossoverHz", "crossover (Hz)", "Hz"),
        ("phaseMarginDeg", "phase margin (deg)", "°"),
        ("upperGainMarginDb", "gain margin (dB)", "dB"),
    ];

    /// <summary>Name of the limit lines.</summary>
    public const string LimitName = "limit";

    /// <summary>Builds the histograms of a run; <paramref name="switchingHz"/> (null for a custom plant) places the crossover limit.</summary>
    public static ChartFigure Build(MonteCarloResult result, DesignCriteria criteria, double? switchingHz)
    {
        var data = new List<ITrace>();
        var notes = new List<Annotation>();
        var xAxes = new List<XAxis>();
        var yAxes = new List<YAxis>();
        for (int k = 0; k < Panels.Count; k++)
        {
            var (figure, title, unit) = Panels[k];
            string x = k == 0 ? "x" : "x" + (k + 1), y = k == 0 ? "y" : "y" + (k + 1);
            decimal left = k * 0.35m, right = left + 0.29m;
            xAxes.Add(new XAxis
            {
                TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow,
                Title = new XAxisTitle { Text = title },
                Domain = [left, right],
                Anchor = y,
                ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI,
                GridColor = ChartPalette.Grid,
                ShowLine = true,
                LineColor = ChartPalette.Ink,
                Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True,
                ZeroLine = false,
            });
            yAxes.Add(new YAxis
            {
                TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow,
                Title = k == 0 ? new YAxisTitle { Text = "samples" } : null,
                Anchor = x,
                RangeMode = Plotly.Blazor.LayoutLib.YAxisLib.RangeModeEnum.ToZero,
                GridColor = ChartPalette.Grid,
                ShowLine = true,
                LineColor = ChartPalette.Ink,
                Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True,
            });

            if (result.Distribution(figure) is not FigureDistribution d || d.HistogramCounts.IsEmpty || !double.IsFinite(d.HistogramStart) || !(d.HistogramBinWidth > 0))
            {
                notes.Add(new Annotation { XRef = x + " domain", YRef = y + " domain", X = 0.5m, Y = 0.5m, ShowArrow = false, Text = "no sample has this figure", Font = new AnnotationFont { Color = ChartPalette.Margin, Size = 13 } });
                continue;
            }

            var centres = new List<object?>(d.HistogramCounts.Length);
            var counts = new List<object?>(d.HistogramCounts.Length);
            for (int b = 0; b < d.HistogramCounts.Length; b++)
            {
                centres.Add(ChartNumbers.Significant(d.HistogramStart + ((b + 0.5) * d.HistogramBinWidth), 6));
                counts.Add(d.HistogramCounts[b]);
            }

            data.Add(new Bar
            {
                Name = figure,
                X = centres,
                Y = counts,
                Width = (decimal)ChartNumbers.Significant(d.HistogramBinWidth * 0.96, 6),
                XAxis = x,
                YAxis = y,
                Marker = new Plotly.Blazor.Traces.BarLib.Marker { Color = ChartPalette.Loop },
                HoverTemplate = "%{y} samples at %{x:.4s}" + unit + "<extra></extra>",
            });

            double? limit = figure switch
            {
                "crossoverHz" => switchingHz is double fs ? criteria.MaxCrossoverFractionOfSwitching * fs : null,
                "phaseMarginDeg" => criteria.MinPhaseMarginDeg,
                "upperGainMarginDb" => criteria.MinGainMarginDb,
                _ => null,
            };
            if (limit is double lim && double.IsFinite(lim))
            {
                int top = d.HistogramCounts.Max();
                data.Add(new Scatter
                {
                    Name = LimitName,
                    Mode = Plotly.Blazor.Traces.ScatterLib.ModeFlag.Lines,
                    X = [lim, lim],
                    Y = [0, top],
                    XAxis = x,
                    YAxis = y,
                    Line = new Plotly.Blazor.Traces.ScatterLib.Line { Color = ChartPalette.Margin, Width = 2m, Dash = "dash" },
                    HoverTemplate = "criterion limit %{x:.4s}" + unit + "<extra></extra>",
                });
            }

            notes.Add(new Annotation
            {
                XRef = x + " domain",
                YRef = y + " domain",
                X = 0.5m,
                Y = 1.0m,
                YAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.YAnchorEnum.Bottom,
                ShowArrow = false,
                Text = $"{d.Count} samples" + (d.MissingCount > 0 ? $", {d.MissingCount} without" : string.Empty),
                Font = new AnnotationFont { Size = 12.5m, Color = ChartPalette.Ink },
            });
        }

        var layout = new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 64, R = 14, T = 30, B = 56 },
            ShowLegend = false,
            BarGap = 0m,
            HoverMode = HoverModeEnum.Closest,
            UiRevision = "histograms",
            XAxis = xAxes,
            YAxis = yAxes,
            Annotations = notes,
        };
        return new ChartFigure(data, layout, []);
    }
}
