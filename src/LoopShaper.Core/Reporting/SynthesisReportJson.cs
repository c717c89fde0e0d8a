using System.Text.Encodings.Web;
using System.Text.Json;

namespace LoopShaper.Core.Reporting;

/// <summary>Writes the synthesis and placement reports as indented JSON: camelCase names that carry units, null for "none", culture-invariant numbers.</summary>
public static class SynthesisReportJson
{
    private static readonly SynthesisJsonContext Context = new(new JsonSerializerOptions
    {
        WriteIndented = true,
        NewLine = "\n",
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    });

    /// <summary>A synthesis report as JSON text, ending with a newline.</summary>
    public static string Write(SynthesisReport report) => JsonSerializer.Serialize(report, Context.SynthesisReport) + "\n";

    /// <summary>A placement report as JSON text, ending with a newline.</summary>
    public static string Write(PlacementReport report) => JsonSerializer.Serialize(report, Context.PlacementReport) + "\n";
}
