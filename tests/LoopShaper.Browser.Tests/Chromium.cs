using Microsoft.Playwright;

namespace LoopShaper.Browser.Tests;

/// <summary>Debian's chromium driven by Playwright, each launch with a new empty profile (a fresh "machine").</summary>
public sealed class Chromium : IAsyncDisposable
{
    /// <summary>Where Debian installs chromium.</summary>
    public const string ExecutablePath = "/usr/bin/chromium";

    private static readonly string[] Arguments =
    [
        "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
        "--disable-sync", "--no-first-run",
    ];

    private readonly IPlaywright _playwright;
    private readonly string _profile;

    private Chromium(IPlaywright playwright, IBrowserContext context, string profile)
    {
        _playwright = playwright;
        Context = context;
        _profile = profile;
    }

    /// <summary>The browser context of this profile.</summary>
    public IBrowserContext Context { get; }

    /// <summary>Starts chromium with a new empty user-data-dir, a 1280 x 800 window and downloads allowed.</summary>
    public static async Task<Chromium> LaunchAsync()
    {
        if (!File.Exists(ExecutablePath))
        {
            throw new InvalidOperationException($"{ExecutablePath} is missing: install Debian's chromium package (apt-get install chromium).");
        }

        var playwright = await Playwright.CreateAsync().ConfigureAwait(false);
        string profile = Directory.CreateTempSubdirectory("loopshaper-chromium-").FullName;
        var context = await playwright.Chromium.LaunchPersistentContextAsync(profile, new BrowserTypeLaunchPersistentContextOptions
        {
            ExecutablePath = ExecutablePath,
            Headless = true,
            Args = Arguments,
            ViewportSize = new ViewportSize { Width = 1280, Height = 800 },
            AcceptDownloads = true,
        }).ConfigureAwait(false);
        return new Chromium(playwright, context, profile);
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        await Context.CloseAsync().ConfigureAwait(false);
        _playwright.Dispose();
        try
        {
            Directory.Delete(_profile, recursive: true);
        }
        catch (IOException)
        {
            // chromium may still hold a lock file for a moment; the temp folder is cleaned by the OS.
        }
    }
}
