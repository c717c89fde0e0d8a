using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting.Html;

namespace LoopShaper.Web;

/// <summary>The printable report of the workspace's current design.</summary>
public static class ReportEndpoints
{
    /// <summary>Path of the report endpoint.</summary>
    public const string ReportPath = "/report";

    /// <summary>
    /// GET /report?d=TOKEN[&amp;paper=A4|Letter]: the HTML report (the core's <see cref="HtmlReportWriter"/>, the same as
    /// `loopshaper report`) of the design packed in a share token, as a download.
    /// </summary>
    public static IEndpointRouteBuilder MapReportEndpoints(this IEndpointRouteBuilder app)
    {
        app.MapGet(ReportPath, (string? d, string? paper) =>
        {
            PaperSize size;
            switch (paper)
            {
                case null or "" or "A4":
                    size = PaperSize.A4;
                    break;
                case "Letter":
                    size = PaperSize.Letter;
                    break;
                default:
                    return Results.BadRequest("Cannot make the report: paper must be A4 or Letter.");
            }

            if (!ShareToken.TryReadJson(d, out var json, out var error))
            {
                return Results.BadRequest("Cannot make the report: " + error);
            }

            var read = DesignFile.Read(json);
            if (read.Design is null)
            {
                return Results.BadRequest("Cannot make the report: " + string.Join("; ", read.Errors.Select(e => e.ToString())));
            }

            var analysis = DesignAnalyzer.Analyze(read.Design);
            string html = HtmlReportWriter.Write(analysis, new HtmlReportOptions(size, DateTimeOffset.UtcNow));
            string file = Path.ChangeExtension(ShareToken.FileNameOf(read.Design.Name), ".report.html");
            return Results.File(System.Text.Encoding.UTF8.GetBytes(html), "text/html; charset=utf-8", file);
        }).ExcludeFromDescription();
        return app;
    }
}
