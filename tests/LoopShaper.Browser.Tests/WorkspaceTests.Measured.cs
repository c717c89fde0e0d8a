using Microsoft.Playwright;

namespace LoopShaper.Browser.Tests;

/// <summary>The measured-response card and the report download in the browser.</summary>
public sealed partial class WorkspaceTests
{
    [Fact]
    public async Task Uploading_a_measurement_overlays_it_on_the_loop_chart_and_shows_the_difference()
    {
        // docs/examples/measured/core-rail-loop-gain.csv: the demo design's loop gain + 1.0 dB, - 3 degrees, in kHz.
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        string file = Path.Combine(RepoRoot(), "docs", "examples", "measured", "core-rail-loop-gain.csv");
        await page.SetInputFilesAsync("[data-measured-file]", file);
        await page.WaitForSelectorAsync("[data-measured-panel=loaded]");
        await page.WaitForSelectorAsync("#difference-chart .main-svg");
        await page.WaitForFunctionAsync("() => (document.getElementById('bode-chart').data || []).some(t => t.name === 'measured T')");
        int points = await page.EvaluateAsync<int>("() => document.getElementById('bode-chart').data.find(t => t.name === 'measured T').x.length");
        Assert.Equal(186, points); // the file's 186 data lines
        Assert.Contains("186 samples", await page.InnerTextAsync("[data-measured-summary]"), StringComparison.Ordinal);
        Assert.EndsWith("°", await page.InnerTextAsync("[data-row='phase-margin'] [data-cell='measured']"), StringComparison.Ordinal);
        var card = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator("[data-measured-panel]") });
        await card.ScrollIntoViewIfNeededAsync();
        await page.WaitForTimeoutAsync(400);
        await card.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, "07-measured.png") });
        var bode = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator("#bode-chart") });
        await bode.ScrollIntoViewIfNeededAsync();
        await page.WaitForTimeoutAsync(400);
        await bode.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, "07b-measured-overlay.png") });

        // A file that cannot be read: its errors by line, and the loaded measurement stays as it was.
        string bad = Path.Combine(Path.GetTempPath(), $"loopshaper-bad-{Guid.NewGuid():N}.csv");
        await File.WriteAllTextAsync(bad, "100,40,-90\n200;30;-100\n");
        try
        {
            await page.SetInputFilesAsync("[data-measured-file]", bad);
            await page.WaitForSelectorAsync("[data-measured-error='2']");
            Assert.Contains("line 2: a semicolon in a file separated by commas", await page.InnerTextAsync("[data-measured-error='2']"), StringComparison.Ordinal);
            Assert.Equal("loaded", await page.GetAttributeAsync("[data-measured-panel]", "data-measured-panel"));
        }
        finally
        {
            File.Delete(bad);
        }

        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task Report_download_is_the_printable_report_of_the_open_design()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        await page.SelectOptionAsync("[data-report-paper]", "Letter");
        // The paper goes into the link when the server has re-rendered the panel; click the link that has it.
        await page.WaitForFunctionAsync("() => /paper=letter/i.test(document.querySelector('[data-report-download]')?.getAttribute('href') ?? '')");
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("[data-report-download]"));
        string html = await File.ReadAllTextAsync(await download.PathAsync());
        Assert.Contains("<h1>Processor core rail 12 V to 1.0 V</h1>", html, StringComparison.Ordinal);
        Assert.Contains("@page { size: letter;", html, StringComparison.Ordinal);
        Assert.Equal("processor-core-rail-12-v-to-1-0-v.report.html", download.SuggestedFilename);

        // The report opened in the browser, as a user would before printing it.
        var report = await _browser.Context.NewPageAsync();
        await report.SetContentAsync(html);
        await report.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(ShotDir, "08-report.png"), FullPage = false });
        Assert.Equal(2, await report.Locator("#bode svg.chart").CountAsync());
        AssertNoConsoleErrors();
    }
}
