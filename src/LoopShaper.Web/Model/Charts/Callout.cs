using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.LayoutLib.AnnotationLib;
using TextPositionEnum = Plotly.Blazor.Traces.ScatterLib.TextPositionEnum;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// A labelled value beside its marker: the annotation box touches the point's corner on the side given, without an
/// arrow. Arrows cost plotly.js a path-length measurement per annotation on every redraw (about a third of a Bode
/// chart's redraw time on the project's 2-core machine, measured with the web benchmark's --probe); the marker already
/// shows the point.
/// </summary>
public static class Callout
{
    /// <summary>Gap between the point and the box's corner, px.</summary>
    public const int GapPx = 9;

    /// <summary>Places <paramref name="note"/> to the right (<paramref name="right"/>) or left of its point, above or below it.</summary>
    public static Annotation Beside(Annotation note, bool right, bool above)
    {
        note.ShowArrow = false;
        note.XAnchor = right ? XAnchorEnum.Left : XAnchorEnum.Right;
        note.YAnchor = above ? YAnchorEnum.Bottom : YAnchorEnum.Top;
        note.XShift = right ? GapPx : -GapPx;
        note.YShift = above ? GapPx : -GapPx;
        return note;
    }

    /// <summary>
    /// The same placement for a label drawn as a trace's text (<see cref="ChartMarks"/>): beside the marker, to the
    /// right or left, above or below. Cheaper than an annotation: plotly.js measures no box for it on a redraw.
    /// </summary>
    public static TextPositionEnum Position(bool right, bool above) => (right, above) switch
    {
        (true, true) => TextPositionEnum.TopRight,
        (false, true) => TextPositionEnum.TopLeft,
        (true, false) => TextPositionEnum.BottomRight,
        _ => TextPositionEnum.BottomLeft,
    };
}
