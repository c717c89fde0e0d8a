using System.Globalization;
using Microsoft.Playwright;

namespace LoopShaper.Browser.Tests;

/// <summary>
/// The corner sweep, the Monte Carlo run and the closed-loop charts in Debian's chromium. Screenshots of every state
/// go to the test output folder (screenshots/); any console error fails the test.
/// </summary>
[Collection(WorkspaceGroup.Name)]
public sealed class CornersAndMonteCarloTests(WorkspaceFixture fixture) : IAsyncLifetime
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
    public async Task The_corner_sweep_lists_every_corner_marks_the_worst_and_overlays_their_loops()
    {
        var page = await OpenAsync();
        // The sweep runs by itself in the background once the design has settled.
        await page.WaitForSelectorAsync("[data-corner-table]", new PageWaitForSelectorOptions { Timeout = 120_000 });
        await page.WaitForSelectorAsync("#corner-bode-chart .main-svg");

        // 3 input corners x 3 load corners x 4 tolerance sets (the core's CornerSet.Full).
        Assert.Equal(36, await page.Locator("[data-corner-row]").CountAsync());
        Assert.Equal(1, await page.Locator("[data-cell='pm'][data-worst='true']").CountAsync());
        string verdict = (await page.InnerTextAsync("[data-corners-verdict]")).Trim();
        Assert.Matches(@"^(All 36 corners meet the criteria|\d+ of 36 corners miss a criterion)$", verdict);

        // The summary judges the same table.
        await page.WaitForSelectorAsync("[data-summary-corners='pass'], [data-summary-corners='fail']");
        Assert.Contains(verdict, await page.InnerTextAsync("[data-summary-corners]"), StringComparison.Ordinal);
        var card = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator("[data-corners-panel]") });
        await card.ScrollIntoViewIfNeededAsync();
        await page.WaitForTimeoutAsync(400);
        await card.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, "10-corners.png") });
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_corner_chart_out_of_sight_waits_and_is_redrawn_when_it_comes_into_view()
    {
        var page = await OpenAsync();
        await page.WaitForSelectorAsync("[data-corner-table]", new PageWaitForSelectorOptions { Timeout = 120_000 });
        await page.WaitForSelectorAsync("#corner-bode-chart .main-svg");
        const string drawn = "() => JSON.stringify(document.getElementById('corner-bode-chart').data.map(t => t.y))";
        const string offscreen = "() => { const r = document.getElementById('corner-bode-chart').getBoundingClientRect(); return r.top > 1.25 * innerHeight || r.bottom < -0.25 * innerHeight; }";
        string before = await page.EvaluateAsync<string>(drawn);
        Assert.True(await page.EvaluateAsync<bool>(offscreen), "the Corners card starts below the first screen");
        string firstRow = await page.InnerTextAsync("[data-corner-row]");

        await page.FillAsync(Inductance, "470 nH");
        // The table (plain HTML) follows once the new design has settled and been swept; the chart out of sight waits.
        await page.WaitForFunctionAsync(
            "text => { const r = document.querySelector('[data-corner-row]'); return r && r.innerText !== text && document.querySelector('[data-corners-panel=finished]'); }",
            firstRow,
            new PageWaitForFunctionOptions { Timeout = 120_000 });
        await page.WaitForTimeoutAsync(1000);
        Assert.Equal(before, await page.EvaluateAsync<string>(drawn));

        var card = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator("[data-corners-panel]") });
        await card.ScrollIntoViewIfNeededAsync();
        await page.WaitForFunctionAsync(
            "before => JSON.stringify(document.getElementById('corner-bode-chart').data.map(t => t.y)) !== before",
            before,
            new PageWaitForFunctionOptions { Timeout = 30_000 });
        await page.WaitForTimeoutAsync(400);
        await card.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, "11-corners-after-change.png") });
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_long_monte_carlo_run_cancels_promptly_and_the_page_keeps_recomputing()
    {
        var page = await OpenAsync();
        await page.FillAsync("[data-mc-samples]", "100000");
        await page.Locator("[data-mc-samples]").DispatchEventAsync("change");
        await page.ClickAsync("[data-mc-run]");
        await page.WaitForSelectorAsync("[data-mc-cancel]");
        await page.WaitForFunctionAsync("() => Number(document.querySelector('[data-mc-progress]')?.getAttribute('data-mc-progress') ?? 0) > 0", null, new PageWaitForFunctionOptions { Timeout = 60_000 });
        await Shot(page, "[data-mc-state]", "11-monte-carlo-running");

        await page.ClickAsync("[data-mc-cancel]");
        await page.WaitForSelectorAsync("[data-mc-state='cancelled']", new PageWaitForSelectorOptions { Timeout = 10_000 });

        // The issue asks for the run to stop within 100 ms of the cancel. Measured on the server, never through the
        // browser: the runner times the cancel request to the end of sampling (no thread left computing a sample), and
        // the background run the cancel request to the runner's return with the partial result, whose summary (sorting
        // the samples done) grows with them and with the machine's load, so it is reported but not held to 100 ms.
        string? haltMs = await page.GetAttributeAsync("[data-mc-sampling-stop-ms]", "data-mc-sampling-stop-ms");
        string? returnMs = await page.GetAttributeAsync("[data-mc-stop-ms]", "data-mc-stop-ms");
        Assert.NotNull(haltMs);
        Assert.NotNull(returnMs);
        double halt = double.Parse(haltMs, CultureInfo.InvariantCulture), returned = double.Parse(returnMs, CultureInfo.InvariantCulture);
        Assert.True(halt < 100, $"sampling stopped {haltMs} ms after the cancel request (partial result after {returnMs} ms)");
        Assert.True(returned >= halt, $"the runner returned ({returnMs} ms) before sampling stopped ({haltMs} ms)");
        int done = int.Parse(await page.GetAttributeAsync("[data-mc-done]", "data-mc-done") ?? "-1", CultureInfo.InvariantCulture);
        Assert.InRange(done, 1, 99_999);
        Assert.Contains("cancelled after", await page.InnerTextAsync(".mc-summary"), StringComparison.Ordinal);
        await Shot(page, "[data-mc-state]", "12-monte-carlo-cancelled");

        // The workspace is still usable: an input change recomputes the analysis.
        string before = await Kpi(page, "phase-margin");
        await page.FillAsync(Inductance, "680 nH");
        await page.WaitForFunctionAsync("([before]) => { const e = document.querySelector(\"[data-kpi-value='phase-margin']\"); return e && e.textContent !== before; }", new object[] { before });
        Assert.NotEqual(before, await Kpi(page, "phase-margin"));
        Assert.Equal(1, await page.Locator("[data-mc-run]").CountAsync());
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task A_small_monte_carlo_run_shows_yield_histograms_and_opens_a_worst_sample_keeping_the_design()
    {
        var page = await OpenAsync();
        string name = await page.InputValueAsync(".design-name");
        await page.FillAsync("[data-mc-samples]", "300");
        await page.Locator("[data-mc-samples]").DispatchEventAsync("change");
        await page.ClickAsync("[data-mc-run]");
        await page.WaitForSelectorAsync("[data-mc-state='finished']", new PageWaitForSelectorOptions { Timeout = 120_000 });
        await page.WaitForSelectorAsync("#mc-histogram-chart .main-svg");
        Assert.Matches(@"^\d+\.\d %$", await page.InnerTextAsync("[data-mc-yield]"));
        Assert.True(await page.Locator("[data-mc-sample]").CountAsync() > 0);
        await Shot(page, "[data-mc-state]", "13-monte-carlo-finished");

        // Opening a sample replaces the design only on the click, and the previous design can be reopened.
        string sample = await page.Locator("[data-mc-open]").First.GetAttributeAsync("data-mc-open") ?? "";
        await page.Locator("[data-mc-open]").First.ClickAsync();
        await page.WaitForSelectorAsync("[data-mc-restore]");
        await page.WaitForFunctionAsync("([n]) => document.querySelector('.design-name').value === n", new object[] { $"{name} · sample {sample}" });
        Assert.Equal($"{name} · sample {sample}", await page.InputValueAsync(".design-name"));
        await Shot(page, "[data-mc-state]", "13b-monte-carlo-sample-opened");
        await page.ClickAsync("[data-mc-restore]");
        await page.WaitForFunctionAsync("([n]) => document.querySelector('.design-name').value === n", new object[] { name });
        AssertNoConsoleErrors();
    }

    [Fact]
    public async Task The_closed_loop_charts_follow_the_chosen_corner()
    {
        var page = await OpenAsync();
        await page.WaitForSelectorAsync("#closed-loop-chart .main-svg");
        await page.WaitForSelectorAsync("[data-closed-loop='ready']");
        await Shot(page, "[data-closed-loop]", "14-closed-loop-main");
        await page.SelectOptionAsync("[data-closed-loop-corner]", "Max-Min-AllLow");
        await page.WaitForSelectorAsync("[data-closed-loop='ready']");
        await page.WaitForSelectorAsync("#transient-chart .main-svg");
        await Shot(page, "[data-closed-loop]", "15-closed-loop-corner");
        AssertNoConsoleErrors();
    }

    private async Task<IPage> OpenAsync()
    {
        var page = await _browser.Context.NewPageAsync();
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
        await page.GotoAsync(fixture.App.BaseUri.ToString());
        await page.WaitForSelectorAsync("[data-circuit=ready]");
        await page.WaitForSelectorAsync("[data-kpi-value='phase-margin']");
        await page.WaitForSelectorAsync("#bode-chart .main-svg");
        return page;
    }

    private static Task<string> Kpi(IPage page, string id) => page.InnerTextAsync($"[data-kpi-value='{id}']");

    private static async Task Shot(IPage page, string inside, string name)
    {
        var card = page.Locator("section.card", new PageLocatorOptions { Has = page.Locator(inside) });
        await card.ScrollIntoViewIfNeededAsync();
        await page.WaitForTimeoutAsync(400); // let Plotly finish its transition
        await card.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(ShotDir, name + ".png") });
    }

    private void AssertNoConsoleErrors()
    {
        lock (_consoleErrors)
        {
            Assert.Empty(_consoleErrors);
        }
    }
}
