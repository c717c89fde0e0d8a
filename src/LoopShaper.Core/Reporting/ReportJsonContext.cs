using System.Text.Json.Serialization;

namespace LoopShaper.Core.Reporting;

/// <summary>Compile-time JSON metadata of the report records (no reflection): camelCase names, nulls written.</summary>
[JsonSourceGenerationOptions(
    WriteIndented = true,
    PropertyNamingPolicy = JsonKnownNamingPolicy.CamelCase,
    DefaultIgnoreCondition = JsonIgnoreCondition.Never,
    NumberHandling = JsonNumberHandling.Strict)]
[JsonSerializable(typeof(AnalysisReport))]
internal sealed partial class ReportJsonContext : JsonSerializerContext;
