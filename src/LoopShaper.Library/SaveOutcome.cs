namespace LoopShaper.Library;

/// <summary>What a save did.</summary>
public enum SaveOutcome
{
    /// <summary>A new revision was committed.</summary>
    Saved,

    /// <summary>The branch moved on since the revision the save was based on: nothing was written.</summary>
    Conflict,

    /// <summary>The input was refused (empty name, duplicate branch name, a design that cannot be written): nothing was written.</summary>
    Rejected,
}
