using Microsoft.Playwright;

namespace LoopShaper.Browser.Tests;

/// <summary>
/// The design library and the compare panel in Debian's chromium: save, change, save again, see the history, restore
/// the first revision, and overlay two revisions. Screenshots go to screenshots/ beside the other browser tests'.
/// </summary>
[Collection(WorkspaceGroup.Name)]
public sealed class LibraryTests(WorkspaceFixture fixture) : IAsyncLifetime
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
    public async Task Save_change_save_restore_and_compare_two_revisions()
    {
        var page = await OpenAsync();
        string original = await page.InputValueAsync(Inductance);

        await page.FillAsync("[data-library-author]", "ana");
        await page.FillAsync("[data-library-tags]", "cpu, board-A");
        await page.FillAsync("[data-library-message]", "first cut");
        await page.ClickAsync("[data-library-save]");
        string first = await BasisAfter(page, null);
        await page.Locator("[data-library]").ScrollIntoViewIfNeededAsync();
        await Shot(page, "21-library-saved");

        string pm = await page.InnerTextAsync("[data-kpi-value='phase-margin']");
        await page.FillAsync(Inductance, "680 nH");
        await page.WaitForFunctionAsync("before => document.querySelector(\"[data-kpi-value='phase-margin']\").textContent !== before", pm);
        await page.FillAsync("[data-library-message]", "680 nH inductor");
        await page.ClickAsync("[data-library-save]");
        string second = await BasisAfter(page, first);
        Assert.Equal(2, await page.Locator("[data-library-history] tbody tr").CountAsync());
        Assert.Contains("680 nH inductor", await page.InnerTextAsync($"[data-library-history] tr[data-revision='{second}']"), StringComparison.Ordinal);
        await page.Locator("[data-library-history]").ScrollIntoViewIfNeededAsync();
        await Shot(page, "22-library-history");

        await page.ClickAsync($"[data-history-restore='{first}']");
        string third = await BasisAfter(page, second);
        await page.WaitForFunctionAsync("([sel, v]) => document.querySelector(sel).value === v", new object[] { Inductance, original });
        Assert.Equal(3, await page.Locator("[data-library-history] tbody tr").CountAsync());
        Assert.Contains($"restored revision {first}", await page.InnerTextAsync($"[data-library-history] tr[data-revision='{third}']"), StringComparison.Ordinal);
        await Shot(page, "23-library-restored");

        // Revision 2 (680 nH) against the open design (the restored first revision): both loops on one chart.
        await page.ClickAsync($"[data-history-compare='{second}']");
        await page.WaitForSelectorAsync("#compare-bode .main-svg");
        await page.WaitForSelectorAsync("#compare-step .main-svg");
        var diff = page.Locator("[data-input-diff='$.plant.powerStage.inductor.inductanceH']");
        await diff.WaitForAsync();
        Assert.Equal(1, await page.Locator("[data-input-diff]").CountAsync());
        Assert.True(await page.Locator("[data-result-diff='phase margin']").CountAsync() == 1);
        // Plotly keeps the drawn traces on the chart's element: magnitude and phase of A and of B.
        Assert.Equal(4, await page.EvaluateAsync<int>("() => document.getElementById('compare-bode').data.length"));
        Assert.Equal(4, await page.EvaluateAsync<int>("() => document.getElementById('compare-step').data.length"));
        await page.EvalOnSelectorAsync("[data-compare-legend]", "e => e.scrollIntoView({ block: 'start' })");
        await Shot(page, "24-compare-bode");
        await page.EvalOnSelectorAsync("[data-compare-inputs]", "e => e.scrollIntoView({ block: 'end' })");
        await Shot(page, "25-compare-steps-and-tables");
        lock (_consoleErrors)
        {
            Assert.Empty(_consoleErrors);
        }
    }

    /// <summary>Waits until the library panel shows a basis revision other than <paramref name="before"/> and returns it.</summary>
    private static async Task<string> BasisAfter(IPage page, string? before)
    {
        await page.WaitForFunctionAsync("before => { const e = document.querySelector('[data-basis-revision]'); return e && e.textContent !== before; }", before ?? string.Empty);
        return await page.InnerTextAsync("[data-basis-revision]");
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
        await page.WaitForSelectorAsync("#bode-chart .main-svg");
        await page.WaitForSelectorAsync("[data-library-status]");
        return page;
    }

    private static async Task Shot(IPage page, string name)
    {
        await page.WaitForTimeoutAsync(400); // let Plotly finish its transition
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(ShotDir, name + ".png") });
    }
}
