using System.Collections.Immutable;
using Plotly.Blazor;

namespace LoopShaper.Web.Model.Charts;

/// <summary>A chart ready for Plotly: typed traces and layout, and which points are clickable markers.</summary>
/// <param name="Data">The traces.</param>
/// <param name="Layout">The layout.</param>
/// <param name="Hits">Clickable markers.</param>
public sealed record ChartFigure(IList<ITrace> Data, Layout Layout, ImmutableArray<MarkerHit> Hits)
{
    /// <summary>The quantity behind a clicked point, or null.</summary>
    public PlacementTarget? TargetAt(int traceIndex, int pointIndex)
        => Hits.FirstOrDefault(h => h.TraceIndex == traceIndex && h.PointIndex == pointIndex)?.Target;
}
