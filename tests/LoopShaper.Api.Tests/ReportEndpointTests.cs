using System.Net;
using LoopShaper.Core.Design;
using LoopShaper.Web;
using LoopShaper.Web.Model;
using Microsoft.AspNetCore.Mvc.Testing;

namespace LoopShaper.Api.Tests;

/// <summary>GET /report: the workspace's report download, the core's HTML report of the design in the share token.</summary>
public sealed class ReportEndpointTests(WebApplicationFactory<Program> factory) : IClassFixture<WebApplicationFactory<Program>>
{
    [Theory]
    [InlineData("", "size: A4")]
    [InlineData("&paper=Letter", "size: letter")]
    public async Task Report_of_a_share_token_is_an_html_download(string paper, string pageRule)
    {
        var design = DesignFile.Read(await File.ReadAllTextAsync(Path.Combine(Repo.ExamplesDir, "industrial-24v-to-5v.json"))).Design!;
        using var client = factory.CreateClient();
        using var response = await client.GetAsync($"{ReportEndpoints.ReportPath}?{ShareToken.QueryName}={ShareToken.FromDesign(design)}{paper}");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("text/html", response.Content.Headers.ContentType?.MediaType);
        Assert.Equal("industrial-24-v-to-5-v-logic-rail.report.html", response.Content.Headers.ContentDisposition?.FileNameStar ?? response.Content.Headers.ContentDisposition?.FileName);
        string html = await response.Content.ReadAsStringAsync();
        Assert.Contains("<h1>Industrial 24 V to 5 V logic rail</h1>", html, StringComparison.Ordinal);
        Assert.Contains(pageRule, html, StringComparison.Ordinal);
        Assert.Contains(System.Net.WebUtility.HtmlEncode(DesignAnalysis.SafetyNotice), html, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("?d=not-a-token", "Cannot make the report")]
    [InlineData("", "Cannot make the report")]
    [InlineData("?paper=A3", "paper must be A4 or Letter")]
    public async Task Bad_request_says_why(string query, string fragment)
    {
        using var client = factory.CreateClient();
        using var response = await client.GetAsync(ReportEndpoints.ReportPath + query);
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Contains(fragment, await response.Content.ReadAsStringAsync(), StringComparison.Ordinal);
    }
}
