using Plotly.Blazor.LayoutLib;
using XAxisTitle = Plotly.Blazor.LayoutLib.XAxisLib.Title;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// What every stacked Bode chart of the workspace shares: the logarithmic frequency axis under the phase pane and the
/// magnitude and phase ranges rounded to whole 20 dB and 45 degree steps (the -180 degree line always in view).
/// </summary>
public static class BodeAxes
{
    /// <summary>Log frequency axis from <paramref name="startHz"/> to <paramref name="stopHz"/>; autoranged when the range is not usable.</summary>
    public static XAxis Frequency(double startHz, double stopHz, string anchor = "y2")
    {
        bool rangeOk = double.IsFinite(startHz) && double.IsFinite(stopHz) && startHz > 0 && stopHz > startHz;
        return new XAxis
        {
            TickLabelOverflow = Plotly.Blazor.LayoutLib.XAxisLib.TickLabelOverflowEnum.Allow,
            Type = Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Log,
            Title = new XAxisTitle { Text = "frequency (Hz)" },
            ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.SI,
            Range = rangeOk ? [Math.Log10(startHz), Math.Log10(stopHz)] : null,
            Anchor = anchor,
            GridColor = ChartPalette.Grid,
            ShowLine = true,
            LineColor = ChartPalette.Ink,
            Mirror = Plotly.Blazor.LayoutLib.XAxisLib.MirrorEnum.True,
            Ticks = Plotly.Blazor.LayoutLib.XAxisLib.TicksEnum.Outside,
        };
    }

    /// <summary>Magnitude range in whole 20 dB steps, at most 200 dB tall, always covering -20..20 dB.</summary>
    public static (double Min, double Max) MagnitudeRange(IEnumerable<double> db)
    {
        var (min, max) = ChartNumbers.Extent(db, -60, 60);
        max = Math.Ceiling((max + 5) / 20) * 20;
        min = Math.Max(Math.Floor((min - 5) / 20) * 20, max - 200);
        return (Math.Min(min, -20), Math.Max(max, 20));
    }

    /// <summary>Phase range in whole 45 degree steps plus 15 degrees of air, always covering -180..0 degrees.</summary>
    public static (double Min, double Max) PhaseRange(IEnumerable<double> deg)
    {
        var (min, max) = ChartNumbers.Extent(deg, -270, 0);
        min = (Math.Floor(Math.Min(min, -180) / 45) * 45) - 15;
        max = (Math.Ceiling(Math.Max(max, 0) / 45) * 45) + 15;
        return (min, max);
    }
}
