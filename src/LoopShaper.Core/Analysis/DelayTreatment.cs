namespace LoopShaper.Core.Analysis;

/// <summary>How a pure delay entered a time response.</summary>
public enum DelayTreatment
{
    /// <summary>The function had no delay.</summary>
    None,

    /// <summary>The delay factored out and the response was shifted in time exactly.</summary>
    ExactShift,

    /// <summary>The delay sat inside a closed loop and was replaced by a Pade approximation.</summary>
    Pade,
}
