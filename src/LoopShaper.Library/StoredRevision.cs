using LoopShaper.Core.Design;

namespace LoopShaper.Library;

/// <summary>A revision with its content: the design file text exactly as it was saved.</summary>
/// <param name="Info">The revision.</param>
/// <param name="Content">The design file (docs/design-file.md) as <see cref="DesignFile.Write"/> wrote it.</param>
public sealed record StoredRevision(RevisionInfo Info, string Content)
{
    /// <summary>True when the content still has the hash stored with it.</summary>
    public bool IsIntact => RevisionHash.Of(Content) == Info.Sha256;

    /// <summary>Reads the content as a design.</summary>
    public DesignFileResult ReadDesign() => DesignFile.Read(Content);
}
