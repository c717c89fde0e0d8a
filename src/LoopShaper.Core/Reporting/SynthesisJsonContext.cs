using System.Text.Json.Serialization;

namespace LoopShaper.Core.Reporting;

/// <summary>Compile-time JSON metadata of the synthesis and placement reports (no reflection): camelCase names, nulls written.</summary>
[JsonSourceGenerationOptions(
    WriteIndented = true,
    PropertyNamingPolicy = JsonKnownNamingPolicy.CamelCase,
    DefaultIgnoreCondition = JsonIgnoreCondition.Never,
    NumberHandling = JsonNumberHandling.Strict)]
[JsonSerializable(typeof(SynthesisReport))]
[JsonSerializable(typeof(PlacementReport))]
internal sealed partial class SynthesisJsonContext : JsonSerializerContext;
