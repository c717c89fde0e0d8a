using System.Text.RegularExpressions;
using Microsoft.Playwright;

namespace LoopShaper.Browser.Tests;

/// <summary>
/// The workspace in Debian's chromium against the app on a free loopback port. Each test saves a screenshot of every
/// state it reaches in the test output folder (screenshots/) and fails on any console error.
/// </summary>
[Collection(WorkspaceGroup.Name)]
public sealed partial class WorkspaceTests(WorkspaceFixture fixture) : IAsyncLifetime
{
    private const string Inductance = "#f-plant-powerStage-inductor-inductanceH";
    private static readonly string ShotDir = Path.Combine(AppContext.BaseDirectory, "screenshots");

    private readonly List<string> _consoleErrors = [];
    private Chromium _browser = default!;

    /// <inheritdoc />
    public async Task InitializeAsync()
    {
        Directory.CreateDirectory(ShotDir);
        _browser = await Chromium.LaunchAsync();
    }

    /// <inheritdoc />
    public async Task DisposeAsync() => await _browser.DisposeAsync();

    [Fact]
    public async Task The_page_opens_with_the_demo_design_on_a_live_circuit()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        Assert.Equal("Processor core rail 12 V to 1.0 V", await page.InputValueAsync(".design-name"));
        Assert.Matches(@"^\d+\.\d °$", await Kpi(page, "phase-margin"));
        Assert.True(await page.Locator("#bode-chart .main-svg").CountAsync() > 0);
        Assert.True(await page.Locator("#step-chart .main-svg").CountAsync() > 0);
        Assert.Contains("Confirm them by measurement", await page.InnerTextAsync("[data-safety-notice]"), StringComparison.Ordinal);
        await Shot(page, "01-opened");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task Changing_the_inductance_changes_the_phase_margin()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        string before = await Kpi(page, "phase-margin");
        await page.FillAsync(Inductance, "680 nH");
        await WaitForChange(page, "phase-margin", before);
        Assert.NotEqual(before, await Kpi(page, "phase-margin"));
        Assert.Equal("680 nH", await page.InputValueAsync(Inductance));

        // The redrawn chart still draws every label of its marks, the new margins' among them: the chart's labels and
        // the summary's numbers come from the same analysis. (plotly.js once dropped labels on a redraw.)
        string pm = (await Kpi(page, "phase-margin")).Replace(" °", string.Empty, StringComparison.Ordinal).Trim();
        await page.WaitForFunctionAsync(
            "pm => [...document.querySelectorAll('#bode-chart .textpoint text')].some(t => t.textContent.includes('PM ' + pm))", pm);
        var labels = await page.EvalOnSelectorAllAsync<string[]>("#bode-chart .textpoint text", "ts => ts.map(t => t.textContent)");
        Assert.Contains(labels, l => l.StartsWith("GM ", StringComparison.Ordinal));
        Assert.Contains(labels, l => l == "\u2212180°");
        await Shot(page, "02-inductance-changed");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task Moving_a_compensator_zero_moves_the_crossover()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        string before = await Kpi(page, "crossover");
        await page.ClickAsync("[data-use-placement]");
        await page.WaitForSelectorAsync("[data-target='Zero1']");
        Assert.Equal(before, await Kpi(page, "crossover"));

        // Select the first zero on the chart and push it down a decade with the keyboard (Shift+Left moves 0.1 decade).
        await page.ClickAsync("[data-handle='Zero1']");
        await page.FocusAsync(".bode");
        for (int i = 0; i < 10; i++)
        {
            await page.Keyboard.PressAsync("Shift+ArrowLeft");
        }

        await WaitForChange(page, "crossover", before);
        Assert.NotEqual(before, await Kpi(page, "crossover"));
        await Shot(page, "03-zero-moved");

        // The slider moves it too.
        string afterKeys = await Kpi(page, "crossover");
        await page.Locator("[data-target='Zero1'] .placement-slider").FillAsync("700");
        await WaitForChange(page, "crossover", afterKeys);
        await Shot(page, "03b-zero-slider");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_broken_design_file_is_refused_with_the_field_named()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        string inductanceBefore = await page.InputValueAsync(Inductance);
        string json = await File.ReadAllTextAsync(Path.Combine(RepoRoot(), "docs", "examples", "core-rail-12v-to-1v0.json"));
        string broken = Regex.Replace(json, "\"inductanceH\": \"[^\"]*\"", "\"inductanceH\": \"lots of henries\"");
        Assert.NotEqual(json, broken);

        await page.SetInputFilesAsync("[data-open-design]", new FilePayload { Name = "broken.json", MimeType = "application/json", Buffer = System.Text.Encoding.UTF8.GetBytes(broken) });
        var error = page.Locator("[data-open-error]").Filter(new LocatorFilterOptions { HasText = "plant.powerStage.inductor.inductanceH" });
        await error.First.WaitForAsync();
        Assert.Contains("Nothing was changed", await page.InnerTextAsync("[data-open-errors]"), StringComparison.Ordinal);
        Assert.Equal(inductanceBefore, await page.InputValueAsync(Inductance));
        await Shot(page, "04-broken-file-refused");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_peak_current_mode_design_shows_qp_and_a_larger_ramp_lowers_it()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        string json = await File.ReadAllTextAsync(Path.Combine(RepoRoot(), "docs", "examples", "pol-12v-to-3v3-peak-current-mode.json"));
        await page.SetInputFilesAsync("[data-open-design]", new FilePayload { Name = "pcm.json", MimeType = "application/json", Buffer = System.Text.Encoding.UTF8.GetBytes(json) });
        await page.WaitForFunctionAsync("() => document.querySelector(\"[data-kpi-value='qp']\") !== null");
        Assert.Equal("PeakCurrentMode", await page.InputValueAsync("[data-control-scheme]"));
        string qpBefore = await Kpi(page, "qp");
        Assert.True(double.TryParse(qpBefore, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out double q0), qpBefore);

        // Ridley 1991: Qp = 1 / (pi (mc D' - 0.5)); more ramp (larger mc) lowers Qp.
        await page.FillAsync("#f-plant-control-ramp-value", "2");
        await page.WaitForFunctionAsync($"() => {{ const e = document.querySelector(\"[data-kpi-value='qp']\"); return e && e.textContent !== '{qpBefore}'; }}");
        string qpAfter = await Kpi(page, "qp");
        Assert.True(double.Parse(qpAfter, System.Globalization.CultureInfo.InvariantCulture) < q0, $"{qpBefore} -> {qpAfter}");
        await Shot(page, "07-peak-current-mode-qp");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_saved_design_reopens_through_its_link_on_another_machine()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        await page.FillAsync(Inductance, "470n");
        await page.FillAsync(".design-name", "Shared core rail");
        await page.Locator(".design-name").DispatchEventAsync("change");
        await page.WaitForFunctionAsync("() => document.querySelector(\"[data-kpi-value='phase-margin']\") !== null");
        await page.WaitForTimeoutAsync(300);
        string pm = await Kpi(page, "phase-margin");
        string fc = await Kpi(page, "crossover");

        await page.ClickAsync("[data-save-menu]");
        string link = await page.InputValueAsync("[data-share-link]");
        Assert.StartsWith(fixture.App.BaseUri.ToString(), link, StringComparison.Ordinal);
        await Shot(page, "05-save-menu");

        // The download is the design file itself.
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("[data-download-design]"));
        string saved = await File.ReadAllTextAsync(await download.PathAsync());
        using (var file = System.Text.Json.JsonDocument.Parse(saved))
        {
            double h = file.RootElement.GetProperty("plant").GetProperty("powerStage").GetProperty("inductor").GetProperty("inductanceH").GetDouble();
            Assert.Equal(470e-9, h, 1e-18);
            Assert.Equal("Shared core rail", file.RootElement.GetProperty("name").GetString());
        }

        Assert.Equal("shared-core-rail.json", download.SuggestedFilename);

        // Another machine: a new browser profile opens the link.
        await using var other = await Chromium.LaunchAsync();
        var elsewhere = await OpenAsync(other, link);
        Assert.Equal("470 nH", await elsewhere.InputValueAsync(Inductance));
        Assert.Equal("Shared core rail", await elsewhere.InputValueAsync(".design-name"));
        Assert.Equal(pm, await Kpi(elsewhere, "phase-margin"));
        Assert.Equal(fc, await Kpi(elsewhere, "crossover"));
        await Shot(elsewhere, "05b-reopened-from-link");
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task Choosing_parts_shows_ideal_against_standard_values_and_downloads_the_parts_list()
    {
        var page = await OpenAsync(_browser, fixture.App.BaseUri.ToString());
        await page.ClickAsync("[data-choose-parts]");
        await page.WaitForSelectorAsync("[data-parts-panel=ready]");
        // The demo's synthesis section asks for E24 resistors; E96 moves R2 from 5.60 kOhm to the nearest E96 value.
        Assert.Equal("E24", await page.InnerTextAsync("[data-part='R2'] [data-cell='series']"));
        await page.SelectOptionAsync("[data-resistor-series]", "E96");
        await page.WaitForFunctionAsync("() => document.querySelector(\"[data-part='R2'] [data-cell='series']\")?.textContent === 'E96'");
        Assert.Equal("5.62 kOhm", await page.InnerTextAsync("[data-part='R2'] [data-cell='snapped']"));
        var card = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator("[data-parts-panel]") });
        await card.ScrollIntoViewIfNeededAsync();
        await page.WaitForTimeoutAsync(200);
        await card.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, "06-parts.png") });

        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("[data-download-parts]"));
        string csv = await File.ReadAllTextAsync(await download.PathAsync());
        Assert.StartsWith("designator,value,unit,display,series,tolerance_pct,role\n", csv, StringComparison.Ordinal);
        Assert.Contains("\nR2,5620,Ohm,5.62 kOhm,E96,1,", csv, StringComparison.Ordinal);
        Assert.Equal("processor-core-rail-12-v-to-1-0-v-parts.csv", download.SuggestedFilename);
        AssertNoConsoleErrors();
    }

    private async Task<IPage> OpenAsync(Chromium browser, string url)
    {
        var page = await browser.Context.NewPageAsync();
        page.Console += (_, m) =>
        {
            if (m.Type == "error")
            {
                lock (_consoleErrors)
                {
                    _consoleErrors.Add(m.Text);
                }
            }
        };
        page.PageError += (_, e) =>
        {
            lock (_consoleErrors)
            {
                _consoleErrors.Add(e);
            }
        };
        await page.GotoAsync(url);
        await page.WaitForSelectorAsync("[data-circuit=ready]");
        await page.WaitForSelectorAsync("[data-kpi-value='phase-margin']");
        await page.WaitForSelectorAsync("#bode-chart .main-svg");
        await page.WaitForSelectorAsync("#step-chart .main-svg");
        return page;
    }

    private static Task<string> Kpi(IPage page, string id) => page.InnerTextAsync($"[data-kpi-value='{id}']");

    private static async Task WaitForChange(IPage page, string kpi, string before)
        => await page.WaitForFunctionAsync("([id, before]) => { const e = document.querySelector(`[data-kpi-value='${id}']`); return e && e.textContent !== before; }", new object[] { kpi, before });

    private static async Task Shot(IPage page, string name)
    {
        await page.WaitForTimeoutAsync(400); // let Plotly finish its transition
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(ShotDir, name + ".png") });
    }

    private void AssertNoConsoleErrors()
    {
        lock (_consoleErrors)
        {
            Assert.Empty(_consoleErrors);
        }
    }

    private static string RepoRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "LoopShaper.sln")))
        {
            dir = dir.Parent;
        }

        return dir?.FullName ?? throw new InvalidOperationException("repository root not found");
    }
}
