using System.Text.Json.Serialization;
using Plotly.Blazor;

namespace LoopShaper.Web.Model.Charts;

/// <summary>A layout whose JSON is already written (<see cref="PlotlyJson.Prepare(Layout)"/>).</summary>
[JsonConverter(typeof(PreparedJsonConverter<PreparedLayout>))]
public sealed class PreparedLayout(string json) : Layout, IPreparedJson
{
    /// <summary>The layout's JSON.</summary>
    public string Json { get; } = json;
}
