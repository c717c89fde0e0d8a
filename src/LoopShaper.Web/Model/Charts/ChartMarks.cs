using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using MarkerSymbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Every small mark of one subplot in a single Plotly trace: reference line segments, markers with their own symbol,
/// size and colour, and text labels beside them. Entries are separated by gaps (null), which plotly.js never joins
/// (connectgaps off). plotly.js's redraw cost grows with the number of traces, annotations and layout shapes far more
/// than with points (measured with the web benchmark's --probe), so a chart with a dozen marks draws them as one trace.
/// </summary>
public sealed class ChartMarks
{
    /// <summary>A white halo behind the labels, so that they read over curves and grid lines without a box.</summary>
    public const string Halo = "0 0 3px #ffffff, 0 0 3px #ffffff, 0 0 2px #ffffff";

    /// <summary>
    /// The text of a drawn entry without a label: a zero-width space, not an empty string. plotly.js removes the text
    /// node of a point whose text is empty and does not make it again on a redraw (Plotly.react) that gives the point a
    /// label: after a change that moved the labels to other entries, the gain-margin and -180 degree labels were gone.
    /// </summary>
    public const string NoLabel = "\u200B";

    private readonly List<object?> _x = [];
    private readonly List<object?> _y = [];
    private readonly List<MarkerSymbol> _symbol = [];
    private readonly List<decimal?> _size = [];
    private readonly List<object> _color = [];
    private readonly List<string> _text = [];
    private readonly List<string> _hover = [];
    private readonly List<TextPositionEnum> _position = [];
    private readonly string _name;
    private readonly string _xAxis;
    private readonly string _yAxis;
    private readonly Line _line;

    /// <summary>Marks on the axes <paramref name="xAxis"/>, <paramref name="yAxis"/>; every segment in the line style given.</summary>
    public ChartMarks(string name, string xAxis, string yAxis, Line line)
    {
        _name = name;
        _xAxis = xAxis;
        _yAxis = yAxis;
        _line = line;
    }

    /// <summary>Entries so far, gaps included (the next entry's index is this plus one when it is not the first).</summary>
    public int Count => _x.Count;

    /// <summary>Number of markers (drawn points, not line ends or gaps).</summary>
    public int MarkerCount => _size.Count(s => s > 0);

    /// <summary>A straight segment from (x0, y0) to (x1, y1), with an optional label at its end; false when not drawable.</summary>
    public bool Segment(double x0, double y0, double x1, double y1, string hover, string? label = null, TextPositionEnum labelPosition = TextPositionEnum.TopLeft)
    {
        if (!double.IsFinite(x0) || !double.IsFinite(y0) || !double.IsFinite(x1) || !double.IsFinite(y1))
        {
            return false;
        }

        Gap();
        Add(x0, y0, MarkerSymbol.Circle, 0, ChartPalette.Reference, NoLabel, hover, TextPositionEnum.TopRight);
        Add(x1, y1, MarkerSymbol.Circle, 0, ChartPalette.Reference, Labelled(label), hover, labelPosition);
        return true;
    }

    /// <summary>A marker at (x, y) with an optional label beside it; its index in the trace, or null when not drawable.</summary>
    public int? Point(double x, double y, MarkerSymbol symbol, int size, string color, string hover, string? label = null, TextPositionEnum labelPosition = TextPositionEnum.TopRight)
    {
        if (!double.IsFinite(x) || !double.IsFinite(y))
        {
            return null;
        }

        Gap();
        Add(x, y, symbol, size, color, Labelled(label), hover, labelPosition);
        return _x.Count - 1;
    }

    /// <summary>The trace; hover shows each entry's hover name and frequency-style x (<paramref name="hoverTemplate"/>), or nothing when null.</summary>
    public Scatter ToTrace(string? hoverTemplate, int fontSize = ChartPalette.FontSize) => new()
    {
        Name = _name,
        ShowLegend = false,
        Mode = ModeFlag.Lines | ModeFlag.Markers | (_text.Any(t => t.Length > 0 && t != NoLabel) ? ModeFlag.Text : 0),
        X = [.. _x],
        Y = [.. _y],
        XAxis = _xAxis,
        YAxis = _yAxis,
        ConnectGaps = false,
        ClipOnAxis = false, // labels may reach past the plot area like annotations; plotly.js still hides points outside the axis ranges
        Line = _line,
        Marker = new Marker
        {
            SymbolArray = [.. _symbol],
            SizeArray = [.. _size],
            ColorArray = [.. _color],
            Opacity = 1m, // plotly.js makes markers with per-point sizes translucent (a bubble chart) unless told
            Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Width = 2.5m, ColorArray = [.. _color] },
        },
        TextArray = [.. _text],
        TextPositionArray = [.. _position],
        TextFont = new TextFont { Color = ChartPalette.Ink, Size = fontSize, Shadow = Halo },
        HoverTextArray = hoverTemplate is null ? null : [.. _hover],
        HoverTemplate = hoverTemplate,
        HoverInfo = hoverTemplate is null ? HoverInfoFlag.Skip : null,
    };

    /// <summary>The entries' x values (gaps as null), for tests and hit maps.</summary>
    public IReadOnlyList<object?> X => _x;

    private static string Labelled(string? label) => string.IsNullOrEmpty(label) ? NoLabel : label;

    // A gap is not drawn at all (plotly.js drops the point's whole group), so its empty text does no harm.
    private void Gap()
    {
        if (_x.Count > 0)
        {
            Add(null, null, MarkerSymbol.Circle, 0, ChartPalette.Reference, string.Empty, string.Empty, TextPositionEnum.TopRight);
        }
    }

    private void Add(double? x, double? y, MarkerSymbol symbol, int size, string color, string text, string hover, TextPositionEnum position)
    {
        _x.Add(x);
        _y.Add(y);
        _symbol.Add(symbol);
        _size.Add(size);
        _color.Add(color);
        _text.Add(text);
        _hover.Add(hover);
        _position.Add(position);
    }
}
