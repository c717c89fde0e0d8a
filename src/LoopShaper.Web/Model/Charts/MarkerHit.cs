namespace LoopShaper.Web.Model.Charts;

/// <summary>Which compensator quantity a clickable chart point stands for.</summary>
/// <param name="TraceIndex">Index of the trace in the figure.</param>
/// <param name="PointIndex">Index of the point in the trace.</param>
/// <param name="Target">The quantity it moves.</param>
public sealed record MarkerHit(int TraceIndex, int PointIndex, PlacementTarget Target);
