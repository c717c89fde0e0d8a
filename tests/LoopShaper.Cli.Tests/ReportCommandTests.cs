using System.Globalization;
using System.Text.RegularExpressions;
using LoopShaper.Core.Design;

namespace LoopShaper.Cli.Tests;

/// <summary>
/// `report`: the HTML on every committed example, and its PDF printed by Debian's chromium and read back with
/// poppler-utils (the test fails when either is missing; test.sh installs both).
/// </summary>
public partial class ReportCommandTests
{
    // ISO 216: A4 is 210 x 297 mm = 595.3 x 841.9 pt; US Letter is 8.5 x 11 in = 612 x 792 pt (1 pt = 1/72 in).
    private const double A4WidthPt = 210 / 25.4 * 72, A4HeightPt = 297 / 25.4 * 72;
    private const double LetterWidthPt = 612, LetterHeightPt = 792;

    [GeneratedRegex(@"<Version>([^<]+)</Version>")]
    private static partial Regex VersionElement();

    private static string ExpectedVersion() => VersionElement().Match(File.ReadAllText(Path.Combine(RepoFiles.Root, "Directory.Build.props"))).Groups[1].Value;

    [Theory]
    [MemberData(nameof(RepoFiles.Examples), MemberType = typeof(RepoFiles))]
    public async Task Html_report_holds_every_part_the_issue_lists_and_needs_no_network(string example)
    {
        using var html = new TempFile("report.html");
        var run = await CliRun.Of("report", RepoFiles.Example(example), "--out", html.Path);
        Assert.Equal(ExitCodes.Success, run.ExitCode);
        Assert.Equal("", run.Error);
        string text = File.ReadAllText(html.Path);
        bool custom = example.StartsWith("custom", StringComparison.Ordinal);
        string[] sections = custom ? ["summary", "inputs", "bode", "steps", "criteria", "parts", "warnings"] : ["summary", "inputs", "operating-point", "bode", "steps", "corners", "criteria", "parts", "warnings"];
        foreach (string id in sections)
        {
            Assert.Contains($"<section id=\"{id}\">", text, StringComparison.Ordinal);
        }

        Assert.Contains(System.Net.WebUtility.HtmlEncode(DesignAnalysis.SafetyNotice), text, StringComparison.Ordinal);
        Assert.Contains("local codes and licensed practice prevail", text, StringComparison.Ordinal);
        Assert.Contains("LoopShaper " + ExpectedVersion(), text, StringComparison.Ordinal);
        Assert.Contains(DateTime.UtcNow.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), text, StringComparison.Ordinal);
        Assert.Contains("@page { size: A4;", text, StringComparison.Ordinal);
        Assert.True(Regex.Count(text, "<svg class=\"chart\"") >= 3, "Bode magnitude, phase and at least one step chart");
        Assert.DoesNotContain("<script", text, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<link", text, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("src=\"http", text, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("NaN", text, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Report_of_a_hazardous_design_shows_the_hazard_at_the_top()
    {
        var run = await CliRun.Of("report", RepoFiles.Example("battery-72v-to-12v-high-voltage.json"));
        Assert.Equal(ExitCodes.Success, run.ExitCode);
        int hazard = run.Output.IndexOf("data-hazard>HAZARDOUS VOLTAGE", StringComparison.Ordinal);
        Assert.True(hazard > 0 && hazard < run.Output.IndexOf("<section id=\"summary\">", StringComparison.Ordinal), "hazard before the summary");
    }

    [Theory]
    [InlineData("A4", A4WidthPt, A4HeightPt)]
    [InlineData("Letter", LetterWidthPt, LetterHeightPt)]
    public async Task Pdf_has_the_paper_size_and_non_blank_pages_with_the_charts_on_their_own_pages(string paper, double widthPt, double heightPt)
    {
        using var html = new TempFile("report.html");
        string pdf = Path.Combine(Path.GetDirectoryName(html.Path)!, "report.pdf");
        var run = await CliRun.Of("report", RepoFiles.Example("industrial-24v-to-5v.json"), "--out", html.Path, "--pdf", pdf, "--paper", paper);
        Assert.True(run.ExitCode == ExitCodes.Success, run.Error);
        Assert.Contains(paper == "A4" ? "size: A4" : "size: letter", File.ReadAllText(html.Path), StringComparison.Ordinal);

        var (pages, w, h) = PdfPages.Info(pdf);
        Assert.Equal(widthPt, w, 1.0);
        Assert.Equal(heightPt, h, 1.0);
        // Summary, inputs and operating point come first (inputs fill more than a page); the print style starts the
        // Bode charts and the steps on new pages; corners, criteria, parts and warnings follow the steps.
        Assert.InRange(pages, 4, 8);
        var ink = PdfPages.InkFractions(pdf);
        Assert.Equal(pages, ink.Count);
        Assert.All(ink, f => Assert.True(f > 0.005, $"a page is blank: non-white fractions {string.Join(", ", ink.Select(x => x.ToString("F4", CultureInfo.InvariantCulture)))}"));

        Assert.Contains("Safety notice.", PdfPages.Text(pdf, 1), StringComparison.Ordinal);
        var texts = Enumerable.Range(1, pages).Select(p => PdfPages.Text(pdf, p).TrimStart()).ToList();
        Assert.Single(texts, t => t.StartsWith("Loop gain (Bode)", StringComparison.Ordinal));
        Assert.Single(texts, t => t.StartsWith("Closed-loop steps", StringComparison.Ordinal));
        Assert.Contains("local codes and licensed practice prevail", texts[^1], StringComparison.Ordinal);
    }

    [Fact]
    public async Task Pdf_without_chromium_says_so_and_still_writes_the_html()
    {
        using var html = new TempFile("report.html");
        string pdf = Path.Combine(Path.GetDirectoryName(html.Path)!, "report.pdf");
        string? before = Environment.GetEnvironmentVariable(PdfPrinter.ChromiumVariable);
        Environment.SetEnvironmentVariable(PdfPrinter.ChromiumVariable, "/nonexistent/chromium");
        try
        {
            var run = await CliRun.Of("report", RepoFiles.Example("industrial-24v-to-5v.json"), "--out", html.Path, "--pdf", pdf);
            Assert.Equal(ExitCodes.PdfUnavailable, run.ExitCode);
            Assert.Contains("chromium was not found", run.Error, StringComparison.Ordinal);
            Assert.True(File.Exists(html.Path));
            Assert.False(File.Exists(pdf));
        }
        finally
        {
            Environment.SetEnvironmentVariable(PdfPrinter.ChromiumVariable, before);
        }
    }

    [Fact]
    public async Task Invalid_design_is_reported_with_its_path_and_nothing_is_written()
    {
        string json = File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json")).Replace("\"switchingFrequencyHz\": \"", "\"switchingFrequencyHz\": \"-", StringComparison.Ordinal);
        using var design = new TempFile("bad.json", json);
        string html = design.Path + ".html";
        var run = await CliRun.Of("report", design.Path, "--out", html);
        Assert.Equal(ExitCodes.InvalidInput, run.ExitCode);
        Assert.Contains("error: $.plant.powerStage.switchingFrequencyHz: -400 kHz is out of range", run.Error, StringComparison.Ordinal);
        Assert.False(File.Exists(html));
    }

    [Fact]
    public async Task Unknown_paper_is_rejected()
    {
        var run = await CliRun.Of("report", RepoFiles.Example("industrial-24v-to-5v.json"), "--paper", "A3");
        Assert.Equal(ExitCodes.InvalidInput, run.ExitCode);
        Assert.Contains("A3", run.Error, StringComparison.Ordinal);
    }
}
