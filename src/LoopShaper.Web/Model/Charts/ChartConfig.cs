using Plotly.Blazor;
using Plotly.Blazor.ConfigLib;

namespace LoopShaper.Web.Model.Charts;

/// <summary>Plotly configuration shared by the charts.</summary>
public static class ChartConfig
{
    /// <summary>Resizes with the page, no logo, the toolbar only on hover (zoom, pan and PNG export stay available).</summary>
    public static Config Interactive => new()
    {
        Responsive = true,
        DisplayLogo = false,
        DisplayModeBar = DisplayModeBarEnum.Hover,
        ModeBarButtonsToRemove = new[] { "lasso2d", "select2d", "autoScale2d" },
    };
}
