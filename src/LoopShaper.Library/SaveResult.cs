namespace LoopShaper.Library;

/// <summary>The result of a save: the new revision, or why nothing was written.</summary>
/// <param name="Outcome">Saved, conflict or rejected.</param>
/// <param name="Revision">The committed revision (saved only).</param>
/// <param name="Head">The branch head the save found instead of its base revision (conflict only).</param>
/// <param name="Message">For a conflict or a refusal: what happened, naming the field and the allowed range where input was wrong.</param>
public sealed record SaveResult(SaveOutcome Outcome, RevisionInfo? Revision, RevisionInfo? Head, string? Message)
{
    /// <summary>A committed revision.</summary>
    public static SaveResult Saved(RevisionInfo revision) => new(SaveOutcome.Saved, revision, null, null);

    /// <summary>The branch head moved on: nothing was written.</summary>
    public static SaveResult Conflict(RevisionInfo head, long basedOnRevisionId) => new(SaveOutcome.Conflict, null, head,
        $"Revision {head.Id} was saved to branch '{head.BranchName}' by {AuthorText(head.Author)} at {head.CreatedUtc:yyyy-MM-dd HH:mm:ss} UTC after revision {basedOnRevisionId}, which this save started from. Nothing was overwritten.");

    /// <summary>Input refused: nothing was written.</summary>
    public static SaveResult Rejected(string message) => new(SaveOutcome.Rejected, null, null, message);

    private static string AuthorText(string author) => author.Length == 0 ? "someone" : author;
}
