namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Trace colours from the Okabe-Ito palette (Okabe and Ito, "Color Universal Design", 2008), distinguishable with
/// the common colour-vision deficiencies; line styles differ as well so the charts also read in black and white.
/// </summary>
public static class ChartPalette
{
    /// <summary>Loop gain T: blue.</summary>
    public const string Loop = "#0072B2";

    /// <summary>Plant Fm Gvd: orange.</summary>
    public const string Plant = "#E69F00";

    /// <summary>Compensator Gc: bluish green.</summary>
    public const string Compensator = "#009E73";

    /// <summary>Margins and crossovers: vermillion.</summary>
    public const string Margin = "#D55E00";

    /// <summary>Gain margins: reddish purple.</summary>
    public const string GainMargin = "#CC79A7";

    /// <summary>Measured responses: black (Okabe-Ito), drawn as diamonds.</summary>
    public const string Measured = "#000000";

    /// <summary>Reference lines and text: near black.</summary>
    public const string Ink = "#1d232a";

    /// <summary>Reference lines (crossover verticals, the -180 degree line, final values): dark grey, dashed.</summary>
    public const string Reference = "#5b6673";

    /// <summary>Grid lines.</summary>
    public const string Grid = "#dde2e8";

    /// <summary>Font stack of every chart.</summary>
    public const string FontFamily = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";

    /// <summary>Base font size, px: large enough for a projector.</summary>
    public const int FontSize = 14;
}
