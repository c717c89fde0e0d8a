namespace LoopShaper.Library;

/// <summary>A line of revisions of one design.</summary>
/// <param name="Id">Branch id.</param>
/// <param name="DesignId">The design.</param>
/// <param name="Name">Name, unique within the design ("main" for the first).</param>
/// <param name="ForkedFromRevisionId">The revision it branched from; null for the design's first branch.</param>
/// <param name="CreatedUtc">When it was made, UTC.</param>
/// <param name="HeadRevisionId">Its newest revision.</param>
public sealed record BranchInfo(long Id, long DesignId, string Name, long? ForkedFromRevisionId, DateTime CreatedUtc, long HeadRevisionId);
