namespace LoopShaper.Web.Model;

/// <summary>One side of a comparison: the open (possibly unsaved) design, or a stored revision.</summary>
/// <param name="RevisionId">The revision; null for the open design.</param>
public sealed record CompareSide(long? RevisionId)
{
    /// <summary>The open design in the workspace.</summary>
    public static CompareSide Workspace { get; } = new((long?)null);

    /// <summary>A stored revision.</summary>
    public static CompareSide Revision(long id) => new(id);

    /// <summary>The value of a picker option: "open" or the revision number.</summary>
    public string Key => RevisionId?.ToString(System.Globalization.CultureInfo.InvariantCulture) ?? "open";

    /// <summary>Reads a picker option's value.</summary>
    public static CompareSide FromKey(string? key) => long.TryParse(key, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out long id) ? Revision(id) : Workspace;
}
