using LoopShaper.Core.Reporting;

namespace LoopShaper.Web;

/// <summary>One error of an API request, located by the JSON path of the design-file field.</summary>
/// <param name="Path">JSON path ("$.plant.powerStage.inductor.inductanceH"; "$" for the body as a whole).</param>
/// <param name="Severity">"error" or "warning".</param>
/// <param name="Message">What is wrong and the allowed range.</param>
public sealed record ApiError(string Path, string Severity, string Message)
{
    /// <summary>The API form of a report issue.</summary>
    public static ApiError From(IssueReport issue)
    {
        ArgumentNullException.ThrowIfNull(issue);
        return new(issue.Path, issue.Severity, issue.Message);
    }
}
