using System.Text.Json.Serialization;

namespace LoopShaper.Web.Model.Charts;

/// <summary>A chart configuration whose JSON is already written (<see cref="PlotlyJson.Serialize"/>).</summary>
/// <param name="Json">The configuration's JSON.</param>
[JsonConverter(typeof(PreparedJsonConverter<PreparedConfig>))]
public sealed record PreparedConfig(string Json) : IPreparedJson;
