using System.Collections.Immutable;
using LoopShaper.Core.Design;
using LoopShaper.Library;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The design library: save the open design (a new design, or a new revision of the one it was opened from), tag,
/// search, open, see a design's history and restore any revision. A save whose branch moved on meanwhile is refused
/// with the reason and can go to a new branch; the form is never touched by a failed save.
/// </summary>
public sealed partial class LibraryPanel : IDisposable
{
    private string _libraryName = string.Empty;
    private string _tags = string.Empty;
    private string _author = string.Empty;
    private string _message = string.Empty;
    private string _branchName = string.Empty;
    private string _search = string.Empty;
    private ImmutableArray<DesignSummary> _results = [];
    private DesignSummary? _history;
    private ImmutableArray<RevisionInfo> _revisions = [];
    private SaveResult? _conflict;
    private string? _error;
    private string? _note;
    private string? _confirm;
    private string? _confirmKey;

    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    [Inject]
    private LibraryHost Host { get; set; } = default!;

    [Inject]
    private LibrarySession Session { get; set; } = default!;

    private RevisionInfo? Basis => Session.BasisOf(Workspace);

    private (long DesignId, string Name)? _nameCache;

    /// <summary>The basis design's library name, looked up once per design (the panel re-renders on every analysis).</summary>
    private string BasisDesignName
    {
        get
        {
            if (Basis is not { } b)
            {
                return string.Empty;
            }

            if (_nameCache is not { } cached || cached.DesignId != b.DesignId)
            {
                _nameCache = (b.DesignId, Host.Library?.Design(b.DesignId)?.Name ?? b.DesignName);
            }

            return _nameCache.Value.Name;
        }
    }

    /// <inheritdoc />
    public void Dispose() => Session.Changed -= OnSessionChanged;

    /// <summary>Saves the open design: a new revision on top of its basis, or a new design when it has none.</summary>
    public Task SaveAsync() => Run(library =>
    {
        var design = Workspace.Form.Build();
        if (Basis is not RevisionInfo basis)
        {
            string name = string.IsNullOrWhiteSpace(_libraryName) ? design.Name : _libraryName;
            return Handle(library.AddDesign(name, design, Tags(), _author, _message));
        }

        var saved = library.Save(basis.Id, design, _author, _message);
        if (saved.Outcome == SaveOutcome.Saved && library.SetTags(basis.DesignId, Tags()) is string tagError)
        {
            _error = tagError;
        }

        return Handle(saved);
    });

    /// <summary>Saves the open design as a new branch of the revision it was based on (after a conflict).</summary>
    public Task SaveAsBranchAsync() => Run(library => Basis is RevisionInfo basis
        ? Handle(library.SaveAsBranch(basis.Id, _branchName, Workspace.Form.Build(), _author, _message))
        : Handle(SaveResult.Rejected("There is no revision to branch from: save the design to the library first.")));

    /// <summary>Saves the open design as a design of its own, whatever it was opened from.</summary>
    public Task SaveAsNewDesignAsync() => Run(library =>
    {
        var design = Workspace.Form.Build();
        return Handle(library.AddDesign(string.IsNullOrWhiteSpace(_libraryName) ? design.Name : _libraryName, design, Tags(), _author, _message));
    });

    /// <summary>Opens a revision in the workspace (asking once when the open design has changes not in the library).</summary>
    public async Task OpenAsync(RevisionInfo revision)
    {
        if (Host.Library is not DesignLibrary library || NeedsConfirmation(library, "Open", "open" + revision.Id))
        {
            return;
        }

        await LoadAsync(library, revision.Id);
        _note = $"Opened revision {revision.Id} of branch '{revision.BranchName}'.";
    }

    /// <summary>Restores a revision: a new revision with its exact content on the branch of the open design (or its own branch), then opens it.</summary>
    public async Task RestoreAsync(RevisionInfo revision)
    {
        if (Host.Library is not DesignLibrary library || NeedsConfirmation(library, "Restore", "restore" + revision.Id))
        {
            return;
        }

        var basis = Basis is RevisionInfo b && b.DesignId == revision.DesignId ? b : library.HeadOfBranchOf(revision.Id)!;
        var restored = library.Restore(revision.Id, basis.Id, _author);
        Clear();
        switch (restored.Outcome)
        {
            case SaveOutcome.Saved:
                await LoadAsync(library, restored.Revision!.Id);
                _note = $"Restored revision {revision.Id} as revision {restored.Revision.Id} on branch '{restored.Revision.BranchName}'.";
                break;
            case SaveOutcome.Conflict:
                _error = "Not restored: " + restored.Message + $" Open revision {restored.Head!.Id} and restore again.";
                break;
            default:
                _error = restored.Message;
                break;
        }

        Refresh(library, revision.DesignId);
    }

    /// <inheritdoc />
    protected override void OnInitialized()
    {
        Session.Changed += OnSessionChanged;
        if (Host.Library is DesignLibrary library)
        {
            _results = library.Search(null);
        }
    }

    private void OnSessionChanged() => _ = InvokeAsync(StateHasChanged);

    private void ShowHistory(long designId)
    {
        if (Host.Library is DesignLibrary library)
        {
            Refresh(library, designId);
        }
    }

    private void OnSearch(ChangeEventArgs e)
    {
        _search = e.Value?.ToString() ?? string.Empty;
        if (Host.Library is DesignLibrary library)
        {
            _results = library.Search(_search);
        }
    }

    private void CompareWithWorkspace(RevisionInfo revision) => Session.Compare(CompareSide.Revision(revision.Id), CompareSide.Workspace);

    private void CompareWithHead()
    {
        if (_conflict?.Head is RevisionInfo head)
        {
            Session.Compare(CompareSide.Revision(head.Id), CompareSide.Workspace);
        }
    }

    private async Task Run(Func<DesignLibrary, Task> action)
    {
        if (Host.Library is DesignLibrary library)
        {
            Clear();
            await action(library);
        }
    }

    private Task Handle(SaveResult result)
    {
        var library = Host.Library!;
        switch (result.Outcome)
        {
            case SaveOutcome.Saved:
                var r = result.Revision!;
                _conflict = null;
                _message = string.Empty;
                Session.SetBasis(Workspace, r);
                int unreadable = Workspace.Form.UnreadableFields.Count();
                _note = $"Saved revision {r.Id} to branch '{r.BranchName}'."
                    + (unreadable > 0 ? $" {unreadable} field(s) could not be read; their last readable values were saved." : string.Empty);
                Refresh(library, r.DesignId);
                break;
            case SaveOutcome.Conflict:
                _conflict = result;
                _branchName = SuggestBranch(library, result.Head!.DesignId);
                break;
            default:
                _error = result.Message;
                break;
        }

        return Task.CompletedTask;
    }

    private async Task LoadAsync(DesignLibrary library, long revisionId)
    {
        if (library.Read(revisionId) is not StoredRevision stored || stored.ReadDesign().Design is not LoopDesign design)
        {
            _error = $"Revision {revisionId} cannot be read as a design file; nothing was changed.";
            return;
        }

        if (!stored.IsIntact)
        {
            _error = $"Revision {revisionId} does not match its stored hash; nothing was changed.";
            return;
        }

        Clear();
        await Workspace.LoadAsync(design);
        Session.SetBasis(Workspace, stored.Info);
        var summary = library.Design(stored.Info.DesignId);
        _tags = summary is null ? string.Empty : string.Join(", ", summary.Tags);
        Refresh(library, stored.Info.DesignId);
    }

    /// <summary>True (and a note shown) on the first press when the open design has changes that no revision holds.</summary>
    private bool NeedsConfirmation(DesignLibrary library, string verb, string key)
    {
        if (_confirmKey == key)
        {
            _confirm = null;
            _confirmKey = null;
            return false;
        }

        bool saved = Basis is RevisionInfo b && library.Read(b.Id)?.Content == DesignFile.Write(Workspace.Form.Build());
        if (saved)
        {
            return false;
        }

        _confirm = verb;
        _confirmKey = key;
        return true;
    }

    private void Refresh(DesignLibrary library, long designId)
    {
        _history = library.Design(designId);
        _revisions = library.History(designId);
        _results = library.Search(_search);
    }

    private void Clear()
    {
        _error = null;
        _note = null;
        _confirm = null;
        _confirmKey = null;
    }

    private string[] Tags() => _tags.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries);

    private string SuggestBranch(DesignLibrary library, long designId)
    {
        var names = library.Branches(designId).Select(b => b.Name).ToHashSet(StringComparer.Ordinal);
        string stem = string.IsNullOrWhiteSpace(_author) ? "branch" : _author.Trim().Replace(' ', '-');
        for (int i = 1; ; i++)
        {
            string name = stem + "-" + i.ToString(System.Globalization.CultureInfo.InvariantCulture);
            if (!names.Contains(name))
            {
                return name;
            }
        }
    }
}
