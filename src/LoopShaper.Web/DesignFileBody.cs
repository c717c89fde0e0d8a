using System.Text.Json;

namespace LoopShaper.Web;

/// <summary>
/// OpenAPI stand-in for the request body of POST /api/analyze: a design file, a JSON object in the format of
/// docs/design-file.md (read by the core's reader, not bound by the framework).
/// </summary>
/// <param name="Format">Always "loopshaper-design".</param>
/// <param name="Version">Design-file version.</param>
/// <param name="Name">Design name.</param>
/// <param name="Plant">The plant section.</param>
/// <param name="Compensator">The compensator section.</param>
/// <param name="Analysis">The analysis section.</param>
/// <param name="Criteria">The criteria section.</param>
public sealed record DesignFileBody(string Format, int Version, string Name, JsonElement Plant, JsonElement Compensator, JsonElement? Analysis, JsonElement? Criteria);
