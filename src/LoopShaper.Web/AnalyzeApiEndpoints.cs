using System.Text;
using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting;
using Microsoft.AspNetCore.Http.Features;

namespace LoopShaper.Web;

/// <summary>
/// The HTTP API for automation (docs/api.md): POST /api/analyze takes a design file and answers with exactly the JSON
/// that `loopshaper analyze FILE --format json` prints. A thin shell over the core's reader, analyser and report writer.
/// </summary>
public static class AnalyzeApiEndpoints
{
    /// <summary>Path of the analysis endpoint.</summary>
    public const string AnalyzePath = "/api/analyze";

    /// <summary>Largest request body accepted, bytes (1 MiB); larger requests get 413.</summary>
    public const int MaxRequestBytes = 1024 * 1024;

    /// <summary>Maps POST /api/analyze.</summary>
    public static IEndpointRouteBuilder MapAnalyzeApi(this IEndpointRouteBuilder app)
    {
        app.MapPost(AnalyzePath, (Func<HttpContext, Task<IResult>>)AnalyzeAsync)
            .WithName("AnalyzeDesign")
            .WithSummary("Analyse a design file")
            .WithDescription("The body is a LoopShaper design file (docs/design-file.md). 200: the analysis report, the same JSON as `loopshaper analyze FILE --format json`. 400: the design file's errors, each with its JSON path. 413: the body is larger than 1 MiB.")
            .Accepts<DesignFileBody>("application/json")
            .Produces<AnalysisReport>(StatusCodes.Status200OK, "application/json")
            .Produces<ApiErrors>(StatusCodes.Status400BadRequest, "application/json")
            .Produces<ApiErrors>(StatusCodes.Status413PayloadTooLarge, "application/json")
            .DisableAntiforgery();
        return app;
    }

    private static async Task<IResult> AnalyzeAsync(HttpContext context)
    {
        var request = context.Request;
        if (request.ContentLength > MaxRequestBytes)
        {
            return TooLarge();
        }

        // Kestrel's own limit for this request, so that a body without Content-Length (chunked) is cut off as well.
        if (context.Features.Get<IHttpMaxRequestBodySizeFeature>() is { IsReadOnly: false } limit)
        {
            limit.MaxRequestBodySize = MaxRequestBytes + 1L;
        }

        byte[] body;
        try
        {
            body = await ReadBoundedAsync(request.Body, MaxRequestBytes + 1, context.RequestAborted).ConfigureAwait(false);
        }
        catch (BadHttpRequestException ex) when (ex.StatusCode == StatusCodes.Status413PayloadTooLarge)
        {
            return TooLarge();
        }

        if (body.Length > MaxRequestBytes)
        {
            return TooLarge();
        }

        string json;
        try
        {
            json = new UTF8Encoding(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true).GetString(body);
        }
        catch (DecoderFallbackException)
        {
            return BadRequest([new ApiError("$", "error", "the body is not UTF-8 text: send the design file as JSON.")]);
        }

        var read = DesignFile.Read(json);
        if (read.Design is not { } design)
        {
            return BadRequest([.. read.Errors.Select(IssueReport.From).Select(ApiError.From)]);
        }

        var analysis = DesignAnalyzer.Analyze(design);
        if (!analysis.IsValid)
        {
            return BadRequest([.. analysis.Issues.Select(IssueReport.From).Select(ApiError.From)]);
        }

        return Results.Text(AnalysisReportJson.Write(AnalysisReport.WithCorners(analysis)), "application/json", Encoding.UTF8);
    }

    private static async Task<byte[]> ReadBoundedAsync(Stream body, int most, CancellationToken cancel)
    {
        using var buffer = new MemoryStream();
        byte[] chunk = new byte[16 * 1024];
        while (buffer.Length < most)
        {
            int n = await body.ReadAsync(chunk.AsMemory(0, (int)Math.Min(chunk.Length, most - buffer.Length)), cancel).ConfigureAwait(false);
            if (n == 0)
            {
                break;
            }

            buffer.Write(chunk, 0, n);
        }

        return buffer.ToArray();
    }

    private static IResult BadRequest(List<ApiError> errors) => Results.Json(new ApiErrors("The design file cannot be analysed.", errors), statusCode: StatusCodes.Status400BadRequest);

    private static IResult TooLarge() => Results.Json(
        new ApiErrors($"The request body is larger than {MaxRequestBytes} bytes (1 MiB).", [new ApiError("$", "error", $"send at most {MaxRequestBytes} bytes.")]),
        statusCode: StatusCodes.Status413PayloadTooLarge);
}
