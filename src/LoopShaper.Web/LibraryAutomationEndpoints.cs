using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Library;

namespace LoopShaper.Web;

/// <summary>
/// A test hook, mapped only when the configuration switch <see cref="SwitchKey"/> is true (never by default): saves a
/// design file to the library over HTTP, so that a test can drive a burst of saves into a child process and kill it.
/// </summary>
public static class LibraryAutomationEndpoints
{
    /// <summary>Configuration switch that maps the endpoint (<c>--Library:AutomationEndpoint true</c>).</summary>
    public const string SwitchKey = "Library:AutomationEndpoint";

    /// <summary>Path of the endpoint.</summary>
    public const string SavePath = "/automation/library/save";

    /// <summary>
    /// POST /automation/library/save[?basedOn=REVISION] with a design file as the body: a new design when no base is
    /// given, else a revision on the base's branch. Answers only after the commit: {"revision": id, "sha256": hash};
    /// 409 on a conflict, 400 for a design file with errors, 503 when the library cannot be opened.
    /// </summary>
    public static IEndpointRouteBuilder MapLibraryAutomationEndpoints(this IEndpointRouteBuilder app)
    {
        app.MapPost(SavePath, async (HttpRequest request, LibraryHost host, long? basedOn) =>
        {
            if (host.Library is not DesignLibrary library)
            {
                return Results.Problem(host.Error, statusCode: StatusCodes.Status503ServiceUnavailable);
            }

            using var reader = new StreamReader(request.Body);
            var read = DesignFile.Read(await reader.ReadToEndAsync().ConfigureAwait(false));
            if (read.Design is not LoopDesign design)
            {
                return Results.BadRequest(string.Join("; ", read.Errors.Select(e => e.ToString())));
            }

            var saved = basedOn is long b
                ? library.Save(b, design, "automation", "automated save")
                : library.AddDesign(design.Name, design, [], "automation", "automated save");
            return saved.Outcome switch
            {
                SaveOutcome.Saved => Results.Text(JsonSerializer.Serialize(new Dictionary<string, object> { ["revision"] = saved.Revision!.Id, ["sha256"] = saved.Revision.Sha256 }), "application/json"),
                SaveOutcome.Conflict => Results.Conflict(saved.Message),
                _ => Results.BadRequest(saved.Message),
            };
        });
        return app;
    }
}
