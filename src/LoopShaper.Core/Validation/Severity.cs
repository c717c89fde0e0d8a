namespace LoopShaper.Core.Validation;

/// <summary>How serious a validation finding is.</summary>
public enum Severity
{
    /// <summary>The design cannot be analysed until this is fixed.</summary>
    Error,

    /// <summary>The design can be analysed, but the engineer should look at this.</summary>
    Warning,
}
