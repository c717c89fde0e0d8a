namespace LoopShaper.Web.Model;

/// <summary>Where a background run is.</summary>
public enum RunState
{
    /// <summary>Not started.</summary>
    Idle,

    /// <summary>Working.</summary>
    Running,

    /// <summary>Finished with a result.</summary>
    Finished,

    /// <summary>Stopped by the engineer before it finished.</summary>
    Cancelled,

    /// <summary>Stopped by an error.</summary>
    Failed,
}
