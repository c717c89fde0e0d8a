using LoopShaper.Core.Validation;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>A titled group of inputs; shows the core's findings that name the group as a whole (e.g. "min &lt;= nominal &lt;= max").</summary>
public partial class FieldGroup
{
    /// <summary>Heading.</summary>
    [Parameter, EditorRequired]
    public string Title { get; set; } = string.Empty;

    /// <summary>Optional one-line explanation.</summary>
    [Parameter]
    public string? Hint { get; set; }

    /// <summary>JSON paths whose findings belong to the group rather than a single field.</summary>
    [Parameter]
    public IReadOnlyList<string> GroupPaths { get; set; } = [];

    /// <summary>The core's findings.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>1 or 2 columns of fields.</summary>
    [Parameter]
    public int Columns { get; set; } = 1;

    /// <summary>The fields.</summary>
    [Parameter]
    public RenderFragment? ChildContent { get; set; }

    private string HeadingId => "g-" + new string([.. Title.Where(char.IsLetterOrDigit)]).ToLowerInvariant();

    private IEnumerable<ValidationIssue> GroupIssues => GroupPaths.SelectMany(Issues.For);
}
