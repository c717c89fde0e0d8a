using System.Text.Json.Serialization;
using Plotly.Blazor;

namespace LoopShaper.Web.Model.Charts;

/// <summary>A trace whose JSON is already written (<see cref="PlotlyJson.Prepare(ITrace)"/>).</summary>
/// <param name="Json">The trace's JSON.</param>
/// <param name="Type">The trace type.</param>
[JsonConverter(typeof(PreparedJsonConverter<PreparedTrace>))]
public sealed record PreparedTrace(string Json, TraceTypeEnum? Type) : ITrace, IPreparedJson;
