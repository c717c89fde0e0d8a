using System.Globalization;
using LoopShaper.Core.Units;

namespace LoopShaper.Core.Validation;

/// <summary>
/// The one place where numeric inputs are checked: finite, inside a range, with a message that names the field and
/// the allowed range (shared/STYLE.md).
/// </summary>
public sealed class Checks
{
    private readonly List<ValidationIssue> _issues = [];

    /// <summary>Everything found so far.</summary>
    public IReadOnlyList<ValidationIssue> Issues => _issues;

    /// <summary>True when an error (not only a warning) was found.</summary>
    public bool HasErrors => _issues.Any(i => i.Severity == Severity.Error);

    /// <summary>Adds an error.</summary>
    public void Error(string field, string message) => _issues.Add(new ValidationIssue(field, message, Severity.Error));

    /// <summary>Adds a warning.</summary>
    public void Warn(string field, string message) => _issues.Add(new ValidationIssue(field, message, Severity.Warning));

    /// <summary>Adds findings of another check.</summary>
    public void AddRange(IEnumerable<ValidationIssue> issues) => _issues.AddRange(issues);

    /// <summary>Requires min &lt;= value &lt;= max (finite); returns true when it holds.</summary>
    public bool InRange(string field, double value, double min, double max, string unit)
    {
        if (!double.IsFinite(value))
        {
            Error(field, $"must be a finite number from {Show(min, unit)} to {Show(max, unit)}.");
            return false;
        }

        if (value < min || value > max)
        {
            Error(field, $"{Show(value, unit)} is out of range: allowed {Show(min, unit)} to {Show(max, unit)}.");
            return false;
        }

        return true;
    }

    /// <summary>Requires min &lt; value &lt;= max (finite, strictly above min); returns true when it holds.</summary>
    public bool Above(string field, double value, double min, double max, string unit)
    {
        if (!double.IsFinite(value))
        {
            Error(field, $"must be a finite number above {Show(min, unit)} and at most {Show(max, unit)}.");
            return false;
        }

        if (value <= min || value > max)
        {
            Error(field, $"{Show(value, unit)} is out of range: allowed above {Show(min, unit)} up to {Show(max, unit)}.");
            return false;
        }

        return true;
    }

    private static string Show(double v, string unit) => double.IsFinite(v) ? EngineeringFormat.Format(v, unit) : v.ToString(CultureInfo.InvariantCulture);
}
