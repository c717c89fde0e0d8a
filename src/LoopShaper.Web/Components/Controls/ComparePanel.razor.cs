using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Library;
using LoopShaper.Library.Comparison;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Two designs side by side: the open design or any stored revision as A and as B, overlaid on a Bode chart and on
/// the step responses, with the design-file fields and the results that differ. Every number comes from the core.
/// </summary>
public sealed partial class ComparePanel : IDisposable
{
    private const string OpenKey = "open";

    private string _a = OpenKey;
    private string _b = OpenKey;
    private ImmutableArray<ChoiceGroup> _choices = [];
    private ShownComparison? _shown;
    private string? _error;
    private bool _busy;
    private int _serial;
    private int _handledRequest;

    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    /// <summary>The comparison on screen, or null.</summary>
    public ShownComparison? Current => _shown;

    [Inject]
    private LibraryHost Host { get; set; } = default!;

    [Inject]
    private LibrarySession Session { get; set; } = default!;

    /// <inheritdoc />
    public void Dispose() => Session.Changed -= OnSessionChanged;

    /// <summary>Compares what the two pickers hold.</summary>
    public async Task CompareAsync()
    {
        if (Host.Library is not DesignLibrary library)
        {
            return;
        }

        _error = null;
        var a = Resolve(library, CompareSide.FromKey(_a));
        var b = Resolve(library, CompareSide.FromKey(_b));
        if (a is null || b is null)
        {
            _error = "That revision is not in the library.";
            return;
        }

        _busy = true;
        StateHasChanged();
        try
        {
            var analysisA = await Task.Run(() => DesignAnalyzer.Analyze(a.Value.Design));
            var analysisB = await Task.Run(() => DesignAnalyzer.Analyze(b.Value.Design));
            _shown = new ShownComparison(++_serial, a.Value.Label, b.Value.Label, analysisA, analysisB,
                DesignFileDiff.Compare(a.Value.Json, b.Value.Json), ResultComparison.Compare(analysisA, analysisB));
        }
        finally
        {
            _busy = false;
        }
    }

    /// <inheritdoc />
    protected override void OnInitialized()
    {
        Session.Changed += OnSessionChanged;
        LoadChoices();
    }

    private void OnSessionChanged() => _ = InvokeAsync(async () =>
    {
        LoadChoices();
        if (Session.Comparison is { } pair && Session.ComparisonRequest != _handledRequest)
        {
            _handledRequest = Session.ComparisonRequest;
            (_a, _b) = (pair.A.Key, pair.B.Key);
            await CompareAsync();
        }

        StateHasChanged();
    });

    private void LoadChoices()
    {
        if (Host.Library is not DesignLibrary library)
        {
            return;
        }

        _choices = [.. library.Search(null).Select(d => new ChoiceGroup(d.Name, [.. library.History(d.Id).Select(r => new Choice(
            r.Id.ToString(CultureInfo.InvariantCulture),
            string.Create(CultureInfo.InvariantCulture, $"revision {r.Id} ({r.BranchName}) {r.CreatedUtc:yyyy-MM-dd HH:mm}{(r.Message.Length > 0 ? " · " + r.Message : string.Empty)}")))]))];
    }

    private (string Label, string Json, LoopDesign Design)? Resolve(DesignLibrary library, CompareSide side)
    {
        if (side.RevisionId is not long id)
        {
            var design = Workspace.Form.Build();
            return ("open design", DesignFile.Write(design), design);
        }

        if (library.Read(id) is not StoredRevision stored || stored.ReadDesign().Design is not LoopDesign read)
        {
            return null;
        }

        string name = library.Design(stored.Info.DesignId)?.Name ?? stored.Info.DesignName;
        return ($"{name}, revision {id} ({stored.Info.BranchName})", stored.Content, read);
    }

    private sealed record Choice(string Key, string Label);

    private sealed record ChoiceGroup(string Design, ImmutableArray<Choice> Revisions);
}
