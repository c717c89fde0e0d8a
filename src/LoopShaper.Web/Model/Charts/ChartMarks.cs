using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using MarkerSymbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Every small mark of one subplot in three Plotly traces, whatever their number: the reference line segments (one
/// lines trace, segments separated by gaps, which plotly.js never joins), the markers with their own symbol, size and
/// colour (one markers trace) and the labels beside them (one text trace). plotly.js's redraw cost grows with the number
/// of traces, annotations and layout shapes far more than with points (measured with the web benchmark's --probe), so a
/// chart with a dozen marks draws them as three traces; and with every point drawn (line ends, unlabelled markers)
/// only what it needs, since each text or marker element plotly.js keeps costs it again on every redraw (measured with
/// --probe: the loop-gain chart's redraw 35 -> 26 ms against one trace with a text for every point).
/// </summary>
public sealed class ChartMarks
{
    /// <summary>A white halo behind the labels, so that they read over curves and grid lines without a box.</summary>
    public const string Halo = "0 0 3px #ffffff, 0 0 3px #ffffff, 0 0 2px #ffffff";

    /// <summary>Where the markers trace is among <see cref="ToTraces"/> (after the lines, before the labels).</summary>
    public const int MarkersTrace = 1;

    private readonly List<object?> _lineX = [];
    private readonly List<object?> _lineY = [];
    private readonly List<string> _lineHover = [];
    private readonly List<object> _markerX = [];
    private readonly List<object> _markerY = [];
    private readonly List<MarkerSymbol> _symbol = [];
    private readonly List<decimal?> _size = [];
    private readonly List<object> _color = [];
    private readonly List<string> _markerHover = [];
    private readonly List<object> _labelX = [];
    private readonly List<object> _labelY = [];
    private readonly List<string> _text = [];
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

    /// <summary>Whether nothing is drawn (every label sits on a segment or a marker).</summary>
    public bool IsEmpty => _lineX.Count == 0 && _markerX.Count == 0;

    /// <summary>Number of markers.</summary>
    public int MarkerCount => _markerX.Count;

    /// <summary>Name of the lines trace of the marks named <paramref name="name"/> (the markers trace has the name itself).</summary>
    public static string LinesName(string name) => name + " lines";

    /// <summary>Name of the labels trace of the marks named <paramref name="name"/>.</summary>
    public static string LabelsName(string name) => name + " labels";

    /// <summary>A straight segment from (x0, y0) to (x1, y1), with an optional label at its end; false when not drawable.</summary>
    public bool Segment(double x0, double y0, double x1, double y1, string hover, string? label = null, TextPositionEnum labelPosition = TextPositionEnum.TopLeft)
    {
        if (!double.IsFinite(x0) || !double.IsFinite(y0) || !double.IsFinite(x1) || !double.IsFinite(y1))
        {
            return false;
        }

        if (_lineX.Count > 0)
        {
            _lineX.Add(null);
            _lineY.Add(null);
            _lineHover.Add(string.Empty);
        }

        _lineX.AddRange([x0, x1]);
        _lineY.AddRange([y0, y1]);
        _lineHover.AddRange([hover, hover]);
        Label(x1, y1, label, labelPosition);
        return true;
    }

    /// <summary>A marker at (x, y) with an optional label beside it; its index in the markers trace, or null when not drawable.</summary>
    public int? Point(double x, double y, MarkerSymbol symbol, int size, string color, string hover, string? label = null, TextPositionEnum labelPosition = TextPositionEnum.TopRight)
    {
        if (!double.IsFinite(x) || !double.IsFinite(y))
        {
            return null;
        }

        _markerX.Add(x);
        _markerY.Add(y);
        _symbol.Add(symbol);
        _size.Add(size);
        _color.Add(color);
        _markerHover.Add(hover);
        Label(x, y, label, labelPosition);
        return _markerX.Count - 1;
    }

    /// <summary>
    /// The three traces, always all three (empty ones too, so that a redraw keeps the trace indices): lines, markers
    /// (<see cref="MarkersTrace"/>) and labels. Hover shows each line end's and marker's hover name and frequency-style x
    /// (<paramref name="hoverTemplate"/>), or nothing when null; the labels never take hover.
    /// </summary>
    public IReadOnlyList<Scatter> ToTraces(string? hoverTemplate, int fontSize = ChartPalette.FontSize)
    {
        var lines = Trace(LinesName(_name), ModeFlag.Lines, _lineX, _lineY, hoverTemplate, _lineHover);
        lines.ConnectGaps = false;
        lines.Line = _line;

        var markers = Trace(_name, ModeFlag.Markers, _markerX, _markerY, hoverTemplate, _markerHover);
        markers.ClipOnAxis = false; // like the labels; plotly.js still hides points outside the axis ranges
        markers.Marker = new Marker
        {
            SymbolArray = [.. _symbol],
            SizeArray = [.. _size],
            ColorArray = [.. _color],
            Opacity = 1m, // plotly.js makes markers with per-point sizes translucent (a bubble chart) unless told
            Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Width = 2.5m, ColorArray = [.. _color] },
        };

        var labels = Trace(LabelsName(_name), ModeFlag.Text, _labelX, _labelY, hoverTemplate: null, hover: []);
        labels.ClipOnAxis = false; // labels may reach past the plot area like annotations
        labels.TextArray = [.. _text];
        labels.TextPositionArray = [.. _position];
        labels.TextFont = new TextFont { Color = ChartPalette.Ink, Size = fontSize, Shadow = Halo };
        return [lines, markers, labels];
    }

    // What the three traces share: a name, no legend entry, the axes, and hover from the template or none at all.
    private Scatter Trace(string name, ModeFlag mode, IEnumerable<object?> x, IEnumerable<object?> y, string? hoverTemplate, List<string> hover) => new()
    {
        Name = name,
        ShowLegend = false,
        Mode = mode,
        X = [.. x],
        Y = [.. y],
        XAxis = _xAxis,
        YAxis = _yAxis,
        HoverTextArray = hoverTemplate is null ? null : [.. hover],
        HoverTemplate = hoverTemplate,
        HoverInfo = hoverTemplate is null ? HoverInfoFlag.Skip : null,
    };

    // Only labelled points reach the labels trace: plotly.js removes the text node of a point whose text is empty and
    // does not make it again on a later redraw (Plotly.react) that gives the point a label.
    private void Label(double x, double y, string? label, TextPositionEnum position)
    {
        if (string.IsNullOrEmpty(label))
        {
            return;
        }

        _labelX.Add(x);
        _labelY.Add(y);
        _text.Add(label);
        _position.Add(position);
    }
}
