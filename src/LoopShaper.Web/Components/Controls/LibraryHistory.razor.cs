using System.Collections.Immutable;
using LoopShaper.Library;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The revisions of one design over all its branches, each with open, restore and compare.</summary>
public sealed partial class LibraryHistory
{
    /// <summary>The design.</summary>
    [Parameter, EditorRequired]
    public long DesignId { get; set; }

    /// <summary>Its library name.</summary>
    [Parameter, EditorRequired]
    public string DesignName { get; set; } = string.Empty;

    /// <summary>Its revisions, newest first.</summary>
    [Parameter, EditorRequired]
    public ImmutableArray<RevisionInfo> Revisions { get; set; } = [];

    /// <summary>The revision the open design is based on, marked in the table.</summary>
    [Parameter]
    public long? CurrentRevisionId { get; set; }

    /// <summary>Open a revision in the workspace.</summary>
    [Parameter]
    public EventCallback<RevisionInfo> OnOpen { get; set; }

    /// <summary>Restore a revision.</summary>
    [Parameter]
    public EventCallback<RevisionInfo> OnRestore { get; set; }

    /// <summary>Compare a revision with the open design.</summary>
    [Parameter]
    public EventCallback<RevisionInfo> OnCompare { get; set; }

    private int BranchCount => Revisions.Select(r => r.BranchId).Distinct().Count();
}
