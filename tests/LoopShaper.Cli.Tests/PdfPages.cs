using System.Diagnostics;
using System.Globalization;

namespace LoopShaper.Cli.Tests;

/// <summary>
/// A PDF looked at with poppler-utils (Debian package; test.sh installs it): page count and size from pdfinfo, text of
/// a page from pdftotext, and each page rendered by pdftoppm to a greyscale PGM (netpbm P5: "P5 width height maxval"
/// then one byte a pixel) whose share of non-white pixels is counted, without an image library.
/// </summary>
internal static class PdfPages
{
    public static string Run(string tool, params string[] args)
    {
        var start = new ProcessStartInfo(tool) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in args)
        {
            start.ArgumentList.Add(a);
        }

        using var p = Process.Start(start) ?? throw new InvalidOperationException($"{tool} did not start: install poppler-utils.");
        var stdout = p.StandardOutput.ReadToEndAsync();
        string stderr = p.StandardError.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, $"{tool} {string.Join(' ', args)} failed ({p.ExitCode}): {stderr}");
        return stdout.Result;
    }

    /// <summary>pdfinfo's "Pages:" and "Page size: W x H pts".</summary>
    public static (int Pages, double WidthPt, double HeightPt) Info(string pdf)
    {
        string info = Run("pdfinfo", pdf);
        string Field(string name) => info.Split('\n').First(l => l.StartsWith(name, StringComparison.Ordinal))[name.Length..].Trim();
        var size = Field("Page size:").Split(' ', StringSplitOptions.RemoveEmptyEntries);
        return (int.Parse(Field("Pages:"), CultureInfo.InvariantCulture), double.Parse(size[0], CultureInfo.InvariantCulture), double.Parse(size[2], CultureInfo.InvariantCulture));
    }

    public static string Text(string pdf, int page) => Run("pdftotext", "-layout", "-f", page.ToString(CultureInfo.InvariantCulture), "-l", page.ToString(CultureInfo.InvariantCulture), pdf, "-");

    /// <summary>Share of pixels darker than 200/255 on each page rendered at 50 dpi.</summary>
    public static List<double> InkFractions(string pdf)
    {
        string dir = Path.GetDirectoryName(pdf)!, prefix = Path.Combine(dir, "page");
        Run("pdftoppm", "-gray", "-r", "50", pdf, prefix);
        var files = Directory.GetFiles(dir, "page-*.pgm").Order(StringComparer.Ordinal).ToList();
        return [.. files.Select(f => Ink(File.ReadAllBytes(f)))];
    }

    private static double Ink(byte[] pgm)
    {
        int pos = 0;
        string Token()
        {
            while (char.IsWhiteSpace((char)pgm[pos]))
            {
                pos++;
            }

            int start = pos;
            while (!char.IsWhiteSpace((char)pgm[pos]))
            {
                pos++;
            }

            return System.Text.Encoding.ASCII.GetString(pgm, start, pos - start);
        }

        Assert.Equal("P5", Token());
        int w = int.Parse(Token(), CultureInfo.InvariantCulture), h = int.Parse(Token(), CultureInfo.InvariantCulture);
        Assert.Equal("255", Token());
        pos++;
        Assert.Equal(w * h, pgm.Length - pos);
        int dark = 0;
        for (int i = pos; i < pgm.Length; i++)
        {
            if (pgm[i] < 200)
            {
                dark++;
            }
        }

        return dark / (double)(w * h);
    }
}
