using System.Collections.Immutable;

namespace LoopShaper.Library;

/// <summary>A design in the library, as a search lists it.</summary>
/// <param name="Id">Design id.</param>
/// <param name="Name">Library name, given at the first save.</param>
/// <param name="CreatedUtc">When it was first saved, UTC.</param>
/// <param name="Tags">Its tags, sorted.</param>
/// <param name="RevisionCount">How many revisions it has over all branches.</param>
/// <param name="Latest">Its newest revision over all branches.</param>
public sealed record DesignSummary(long Id, string Name, DateTime CreatedUtc, ImmutableArray<string> Tags, int RevisionCount, RevisionInfo Latest);
