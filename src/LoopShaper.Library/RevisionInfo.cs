namespace LoopShaper.Library;

/// <summary>One stored revision of a design, without its content.</summary>
/// <param name="Id">Revision number, unique in the library, increasing with every save.</param>
/// <param name="DesignId">The design it belongs to.</param>
/// <param name="BranchId">The branch it was appended to.</param>
/// <param name="BranchName">That branch's name.</param>
/// <param name="ParentId">The revision it was based on (the previous head, or the fork point of a new branch); null for a design's first revision.</param>
/// <param name="Author">Who saved it (free text, may be empty).</param>
/// <param name="Message">What changed, in the author's words (may be empty).</param>
/// <param name="CreatedUtc">When it was committed, UTC.</param>
/// <param name="DesignName">The design's own name field at this revision.</param>
/// <param name="Sha256">SHA-256 of the design file text (UTF-8), lower-case hex.</param>
/// <param name="RestoredFromId">The revision whose content this one restored; null for an ordinary save.</param>
public sealed record RevisionInfo(long Id, long DesignId, long BranchId, string BranchName, long? ParentId, string Author, string Message, DateTime CreatedUtc, string DesignName, string Sha256, long? RestoredFromId);
