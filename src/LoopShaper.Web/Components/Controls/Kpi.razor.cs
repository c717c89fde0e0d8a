using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>One headline figure with its name and a line of detail; tinted by its criterion verdict.</summary>
public partial class Kpi
{
    /// <summary>Name of the figure.</summary>
    [Parameter, EditorRequired]
    public string Name { get; set; } = string.Empty;

    /// <summary>Stable id for tests and styling ("phase-margin").</summary>
    [Parameter, EditorRequired]
    public string Id { get; set; } = string.Empty;

    /// <summary>The formatted value.</summary>
    [Parameter, EditorRequired]
    public string Value { get; set; } = string.Empty;

    /// <summary>A line under the value.</summary>
    [Parameter]
    public string? Detail { get; set; }

    /// <summary>"pass", "fail" or null.</summary>
    [Parameter]
    public string? State { get; set; }
}
