namespace LoopShaper.Core.Validation;

/// <summary>A finding about one input field.</summary>
/// <param name="Field">Path of the field in the design file, e.g. "plant.powerStage.inductor.inductanceH".</param>
/// <param name="Message">What is wrong and the allowed range, in words a user reads.</param>
/// <param name="Severity">Error or warning.</param>
public sealed record ValidationIssue(string Field, string Message, Severity Severity = Severity.Error)
{
    /// <summary>"field: message".</summary>
    public override string ToString() => $"{Field}: {Message}";
}
