using System.Net;
using System.Text;
using System.Text.Json;
using LoopShaper.Web;
using Microsoft.AspNetCore.Mvc.Testing;

namespace LoopShaper.Api.Tests;

/// <summary>
/// POST /api/analyze in-process (WebApplicationFactory): the answer for a valid design is byte for byte what
/// `loopshaper analyze FILE --format json` prints; invalid designs get 400 with the JSON path of every error (the same
/// paths and messages the command line prints); bodies above 1 MiB get 413.
/// </summary>
public sealed class AnalyzeApiTests(WebApplicationFactory<Program> factory) : IClassFixture<WebApplicationFactory<Program>>
{
    public static TheoryData<string> Examples() => [.. Directory.GetFiles(Repo.ExamplesDir, "*.json").Order(StringComparer.Ordinal).Select(f => Path.GetFileName(f))];

    private static StringContent Json(string text) => new(text, Encoding.UTF8, "application/json");

    private static async Task<string> CliJson(string file)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        int code = await LoopShaper.Cli.Program.RunAsync(["analyze", file, "--format", "json"], output, error);
        Assert.True(code is 0 or 1, $"analyze exited {code}: {error}");
        return output.ToString();
    }

    [Theory]
    [MemberData(nameof(Examples))]
    public async Task Valid_design_gives_200_and_the_json_of_the_command_line(string example)
    {
        string file = Path.Combine(Repo.ExamplesDir, example);
        using var client = factory.CreateClient();
        using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(await File.ReadAllTextAsync(file)));
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("application/json", response.Content.Headers.ContentType?.MediaType);
        Assert.Equal(await CliJson(file), await response.Content.ReadAsStringAsync());
    }

    [Fact]
    public async Task The_corner_table_takes_the_tolerances_of_the_posted_file()
    {
        // The example's own section (L +-20 %): the all-low corners differ from the nominal-parts ones. Every band of the
        // section and of the compensator's parts at 0 %, every multiplier 1: they are the same corner, figure for figure.
        var design = System.Text.Json.Nodes.JsonNode.Parse(await File.ReadAllTextAsync(Path.Combine(Repo.ExamplesDir, "pol-12v-to-3v3-peak-current-mode.json")))!;
        using var client = factory.CreateClient();
        var asIs = await Rows(design.ToJsonString());
        Assert.NotEqual(asIs["Vin max, load min, nominal parts"], asIs["Vin max, load min, all low"]);
        var tolerances = design["tolerances"]!.AsObject();
        foreach (string band in new[] { "inductancePct", "capacitancePct", "senseGainPct", "rampPct", "transconductancePct" })
        {
            tolerances[band] = 0;
        }

        foreach (string factor in new[] { "esrLowFactor", "esrHighFactor", "dcrLowFactor", "dcrHighFactor" })
        {
            tolerances[factor] = 1;
        }

        foreach (var entry in tolerances["capacitors"]!.AsArray())
        {
            entry!["tolerancePct"] = 0;
        }

        design["synthesis"] = new System.Text.Json.Nodes.JsonObject { ["resistorTolerancePct"] = 0, ["capacitorTolerancePct"] = 0 };
        var tight = await Rows(design.ToJsonString());
        Assert.Equal(asIs["Vin max, load min, nominal parts"], tight["Vin max, load min, nominal parts"]);
        Assert.Equal(tight["Vin max, load min, nominal parts"], tight["Vin max, load min, all low"]);
        Assert.Equal(tight["Vin min, load max, nominal parts"], tight["Vin min, load max, worst case"]);

        async Task<Dictionary<string, string>> Rows(string body)
        {
            using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(body));
            Assert.Equal(HttpStatusCode.OK, response.StatusCode);
            using var doc = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
            return doc.RootElement.GetProperty("cornerTable").GetProperty("rows").EnumerateArray().ToDictionary(
                r => r.GetProperty("label").GetString()!,
                r => $"{r.GetProperty("crossoverHz").GetRawText()} {r.GetProperty("phaseMarginDeg").GetRawText()} {r.GetProperty("upperGainMarginDb").GetRawText()}");
        }
    }

    [Fact]
    public async Task Out_of_range_field_gives_400_with_its_path_and_the_command_line_message()
    {
        string json = (await File.ReadAllTextAsync(Path.Combine(Repo.ExamplesDir, "industrial-24v-to-5v.json"))).Replace("\"switchingFrequencyHz\": \"", "\"switchingFrequencyHz\": \"-", StringComparison.Ordinal);
        using var client = factory.CreateClient();
        using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(json));
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var errors = await Errors(response);
        var e = Assert.Single(errors, x => x.Severity == "error");
        Assert.Equal("$.plant.powerStage.switchingFrequencyHz", e.Path);

        string file = Path.Combine(Path.GetTempPath(), $"loopshaper-api-{Guid.NewGuid():N}.json");
        await File.WriteAllTextAsync(file, json);
        try
        {
            using var output = new StringWriter();
            using var error = new StringWriter();
            Assert.Equal(2, await LoopShaper.Cli.Program.RunAsync(["analyze", file, "--format", "json"], output, error));
            Assert.Contains($"error: {e.Path}: {e.Message}", error.ToString(), StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(file);
        }
    }

    [Theory]
    [InlineData("{ \"format\": \"loopshaper-design\", ", "$")]
    [InlineData("[1, 2, 3]", "$")]
    [InlineData("", "$")]
    public async Task Malformed_json_gives_400_located_at_the_root(string body, string path)
    {
        using var client = factory.CreateClient();
        using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(body));
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var errors = await Errors(response);
        Assert.NotEmpty(errors);
        Assert.All(errors, e => Assert.StartsWith(path, e.Path, StringComparison.Ordinal));
        Assert.All(errors, e => Assert.False(string.IsNullOrWhiteSpace(e.Message)));
    }

    [Fact]
    public async Task Unknown_and_mistyped_fields_are_each_named_by_path()
    {
        string json = (await File.ReadAllTextAsync(Path.Combine(Repo.ExamplesDir, "industrial-24v-to-5v.json")))
            .Replace("\"outputVoltageV\": 5,", "\"outputVoltageV\": true, \"outputVoltsTypo\": 5,", StringComparison.Ordinal);
        using var client = factory.CreateClient();
        using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(json));
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var paths = (await Errors(response)).Select(e => e.Path).ToList();
        Assert.Contains("$.plant.powerStage.outputVoltageV", paths);
        Assert.Contains("$.plant.powerStage.outputVoltsTypo", paths);
    }

    [Fact]
    public async Task Body_that_is_not_utf8_gives_400()
    {
        using var client = factory.CreateClient();
        using var content = new ByteArrayContent([0x7B, 0xFF, 0xFE, 0x7D]);
        content.Headers.ContentType = new("application/json");
        using var response = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, content);
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Contains("UTF-8", (await Errors(response)).Single().Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Body_of_exactly_the_limit_is_accepted_and_one_byte_more_gives_413()
    {
        // A valid design padded with trailing spaces (JSON whitespace) to exactly 1 MiB, then to 1 MiB + 1 byte.
        string json = (await File.ReadAllTextAsync(Path.Combine(Repo.ExamplesDir, "industrial-24v-to-5v.json"))).TrimEnd();
        int bytes = Encoding.UTF8.GetByteCount(json);
        using var client = factory.CreateClient();
        using var atLimit = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(json + new string(' ', AnalyzeApiEndpoints.MaxRequestBytes - bytes)));
        Assert.Equal(HttpStatusCode.OK, atLimit.StatusCode);
        using var over = await client.PostAsync(AnalyzeApiEndpoints.AnalyzePath, Json(json + new string(' ', AnalyzeApiEndpoints.MaxRequestBytes - bytes + 1)));
        Assert.Equal(HttpStatusCode.RequestEntityTooLarge, over.StatusCode);
        Assert.Contains("1 MiB", (await JsonDocument.ParseAsync(await over.Content.ReadAsStreamAsync())).RootElement.GetProperty("title").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Oversized_body_without_content_length_gives_413()
    {
        using var client = factory.CreateClient();
        using var content = new StreamContent(new UnknownLengthStream(new byte[3 * 1024 * 1024]));
        content.Headers.ContentType = new("application/json");
        using var request = new HttpRequestMessage(HttpMethod.Post, AnalyzeApiEndpoints.AnalyzePath) { Content = content };
        request.Headers.TransferEncodingChunked = true;
        using var response = await client.SendAsync(request);
        Assert.Equal(HttpStatusCode.RequestEntityTooLarge, response.StatusCode);
    }

    [Fact]
    public async Task Openapi_document_describes_the_analyze_endpoint()
    {
        using var client = factory.CreateClient();
        using var response = await client.GetAsync("/openapi/v1.json");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        using var doc = await JsonDocument.ParseAsync(await response.Content.ReadAsStreamAsync());
        var post = doc.RootElement.GetProperty("paths").GetProperty(AnalyzeApiEndpoints.AnalyzePath).GetProperty("post");
        Assert.True(post.GetProperty("requestBody").GetProperty("content").TryGetProperty("application/json", out _));
        var responses = post.GetProperty("responses");
        foreach (string code in (string[])["200", "400", "413"])
        {
            Assert.True(responses.TryGetProperty(code, out _), $"response {code} documented");
        }

        Assert.Contains("1 MiB", post.GetProperty("description").GetString(), StringComparison.Ordinal);
        Assert.Equal([AnalyzeApiEndpoints.AnalyzePath], doc.RootElement.GetProperty("paths").EnumerateObject().Select(p => p.Name));
        Assert.Equal("LoopShaper API", doc.RootElement.GetProperty("info").GetProperty("title").GetString());
    }

    private static async Task<List<ApiError>> Errors(HttpResponseMessage response)
    {
        Assert.Equal("application/json", response.Content.Headers.ContentType?.MediaType);
        var body = await JsonSerializer.DeserializeAsync<ApiErrors>(await response.Content.ReadAsStreamAsync(), JsonSerializerOptions.Web);
        Assert.NotNull(body);
        Assert.False(string.IsNullOrWhiteSpace(body.Title));
        return [.. body.Errors];
    }

    /// <summary>A stream that hides its length, so that the request goes chunked without Content-Length.</summary>
    private sealed class UnknownLengthStream(byte[] data) : MemoryStream(data)
    {
        public override bool CanSeek => false;

        public override long Length => throw new NotSupportedException();

        public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    }
}
