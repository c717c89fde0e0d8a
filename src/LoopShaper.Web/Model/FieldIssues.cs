using System.Collections.Immutable;
using LoopShaper.Core.Validation;

namespace LoopShaper.Web.Model;

/// <summary>The core's findings sorted by the JSON path they name, so that each lands beside its field.</summary>
public sealed class FieldIssues
{
    private readonly ILookup<string, ValidationIssue> _byField;

    /// <summary>Sorts findings by field.</summary>
    public FieldIssues(IEnumerable<ValidationIssue> issues)
    {
        All = [.. issues];
        _byField = All.ToLookup(i => i.Field, StringComparer.Ordinal);
    }

    /// <summary>No findings.</summary>
    public static FieldIssues None { get; } = new([]);

    /// <summary>Every finding.</summary>
    public ImmutableArray<ValidationIssue> All { get; }

    /// <summary>Findings naming exactly this path.</summary>
    public IEnumerable<ValidationIssue> For(string path) => _byField[path];

    /// <summary>Findings naming none of the given paths (shown in the summary so that nothing is lost).</summary>
    public IEnumerable<ValidationIssue> Except(IEnumerable<string> shownPaths)
    {
        var shown = shownPaths.ToHashSet(StringComparer.Ordinal);
        return All.Where(i => !shown.Contains(i.Field));
    }
}
