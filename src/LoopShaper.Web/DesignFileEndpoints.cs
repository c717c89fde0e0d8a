using System.Text;
using LoopShaper.Core.Design;

namespace LoopShaper.Web;

/// <summary>HTTP endpoints of the workspace besides the interactive page.</summary>
public static class DesignFileEndpoints
{
    /// <summary>Path of the download endpoint.</summary>
    public const string DownloadPath = "/design-file";

    /// <summary>
    /// GET /design-file?d=TOKEN: the design file packed in a share token, as a download. The file is re-read with
    /// <see cref="DesignFile.Read"/> first, so that only a well-formed design file is ever served.
    /// </summary>
    public static IEndpointRouteBuilder MapDesignFileEndpoints(this IEndpointRouteBuilder app)
    {
        app.MapGet(DownloadPath, (string? d) =>
        {
            if (!ShareToken.TryReadJson(d, out var json, out var error))
            {
                return Results.BadRequest("Cannot make the design file: " + error);
            }

            var read = DesignFile.Read(json);
            if (read.Design is null)
            {
                return Results.BadRequest("Cannot make the design file: " + string.Join("; ", read.Errors.Select(e => e.ToString())));
            }

            return Results.File(Encoding.UTF8.GetBytes(json), "application/json", ShareToken.FileNameOf(read.Design.Name));
        }).ExcludeFromDescription();
        return app;
    }
}
