using System.Text.Encodings.Web;
using System.Text.Json;

namespace LoopShaper.Core.Reporting;

/// <summary>Writes an <see cref="AnalysisReport"/> as indented JSON: camelCase names that carry units, null for "none", culture-invariant numbers.</summary>
public static class AnalysisReportJson
{
    private static readonly ReportJsonContext Context = new(new JsonSerializerOptions
    {
        WriteIndented = true,
        NewLine = "\n",
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        // Reports are files and API bodies, not HTML: keep quotes and symbols readable.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    });

    /// <summary>The report as JSON text, ending with a newline.</summary>
    public static string Write(AnalysisReport report) => JsonSerializer.Serialize(report, Context.AnalysisReport) + "\n";
}
