using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Reporting;

/// <summary>An input error or warning, located by its JSON path in the design file.</summary>
/// <param name="Path">JSON path of the field ("$.plant.powerStage.inductor.inductanceH"; "$" for the design as a whole).</param>
/// <param name="Severity">"error" or "warning".</param>
/// <param name="Message">What is wrong and the allowed range.</param>
public sealed record IssueReport(string Path, string Severity, string Message)
{
    /// <summary>The report of a validation finding; validator field names become JSON paths.</summary>
    public static IssueReport From(ValidationIssue issue) => new(PathOf(issue.Field), issue.Severity == Validation.Severity.Error ? "error" : "warning", issue.Message);

    /// <summary>The JSON path of a validator field name: "plant.feedback" becomes "$.plant.feedback", "design" becomes "$".</summary>
    public static string PathOf(string field) => field switch
    {
        _ when field.StartsWith('$') => field,
        "" or "design" => "$",
        _ => "$." + field,
    };

    /// <summary>"error: $.path: message".</summary>
    public override string ToString() => $"{Severity}: {Path}: {Message}";
}
