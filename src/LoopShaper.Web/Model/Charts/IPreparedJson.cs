namespace LoopShaper.Web.Model.Charts;

/// <summary>A Plotly object whose JSON is already written.</summary>
public interface IPreparedJson
{
    /// <summary>The JSON.</summary>
    string Json { get; }
}
