using System.Diagnostics;

namespace LoopShaper.Cli;

/// <summary>
/// Prints an HTML file to PDF with headless chromium (`chromium --headless --print-to-pdf`), which honours the
/// report's CSS @page size. Chromium is looked up on PATH, then at /usr/bin/chromium; each run gets its own empty
/// profile so that it never touches a running browser.
/// </summary>
public static class PdfPrinter
{
    private const int TimeoutMs = 120_000;

    /// <summary>Environment variable that names the chromium executable to use instead of the search.</summary>
    public const string ChromiumVariable = "LOOPSHAPER_CHROMIUM";

    /// <summary>The chromium executable (<see cref="ChromiumVariable"/>, else PATH, else /usr/bin/chromium), or null when there is none.</summary>
    public static string? FindChromium()
    {
        if (Environment.GetEnvironmentVariable(ChromiumVariable) is { Length: > 0 } named)
        {
            return File.Exists(named) ? named : null;
        }

        foreach (string dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            foreach (string name in (string[])["chromium", "chromium-browser"])
            {
                string candidate = Path.Combine(dir, name);
                if (File.Exists(candidate))
                {
                    return candidate;
                }
            }
        }

        return File.Exists("/usr/bin/chromium") ? "/usr/bin/chromium" : null;
    }

    /// <summary>Prints <paramref name="htmlFile"/> to <paramref name="pdfFile"/>; false with the reason when it cannot.</summary>
    public static bool TryPrint(string htmlFile, string pdfFile, out string error)
    {
        if (FindChromium() is not string chromium)
        {
            error = $"cannot write the PDF: chromium was not found ({ChromiumVariable}, PATH, /usr/bin/chromium; Debian: apt-get install chromium). The HTML report was written; open it in a browser and print it.";
            return false;
        }

        string profile = Directory.CreateTempSubdirectory("loopshaper-pdf-").FullName;
        string pdf = Path.GetFullPath(pdfFile);
        try
        {
            File.Delete(pdf);
            var start = new ProcessStartInfo(chromium)
            {
                RedirectStandardError = true,
                RedirectStandardOutput = true,
                UseShellExecute = false,
            };
            foreach (string a in (string[])["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-pdf-header-footer", "--user-data-dir=" + profile, "--print-to-pdf=" + pdf, new Uri(Path.GetFullPath(htmlFile)).AbsoluteUri])
            {
                start.ArgumentList.Add(a);
            }

            using var process = Process.Start(start)!;
            var stderr = process.StandardError.ReadToEndAsync();
            _ = process.StandardOutput.ReadToEndAsync();
            if (!process.WaitForExit(TimeoutMs))
            {
                process.Kill(entireProcessTree: true);
                error = $"cannot write the PDF: chromium did not finish within {TimeoutMs / 1000} s.";
                return false;
            }

            if (process.ExitCode != 0 || !File.Exists(pdf) || new FileInfo(pdf).Length == 0)
            {
                string tail = string.Join(" ", stderr.Result.Split('\n', StringSplitOptions.RemoveEmptyEntries).TakeLast(3));
                error = $"cannot write the PDF: chromium exited with code {process.ExitCode}: {tail}";
                return false;
            }

            error = "";
            return true;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or System.ComponentModel.Win32Exception or InvalidOperationException)
        {
            error = "cannot write the PDF: " + ex.Message;
            return false;
        }
        finally
        {
            try
            {
                Directory.Delete(profile, recursive: true);
            }
            catch (IOException)
            {
                // chromium may still be releasing its profile; a temp folder left behind is harmless.
            }
        }
    }
}
