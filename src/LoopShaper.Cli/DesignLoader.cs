using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting;

namespace LoopShaper.Cli;

/// <summary>Reads a design file and analyses it, writing every input error to the error stream with its JSON path.</summary>
internal static class DesignLoader
{
    /// <summary>The analysis of a valid design, or null after writing the errors.</summary>
    public static DesignAnalysis? Analyze(string file, TextWriter error)
    {
        string json;
        try
        {
            json = File.ReadAllText(file);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            error.WriteLine($"{file}: error: cannot read the design file: {ex.Message}");
            return null;
        }

        var read = DesignFile.Read(json);
        if (read.Design is not { } design)
        {
            foreach (var e in read.Errors)
            {
                Report(error, file, IssueReport.From(e));
            }

            return null;
        }

        var analysis = DesignAnalyzer.Analyze(design);
        if (!analysis.IsValid)
        {
            foreach (var issue in analysis.Issues.Select(IssueReport.From))
            {
                Report(error, file, issue);
            }

            return null;
        }

        return analysis;
    }

    /// <summary>Writes text to a file, or to the output when no file is given; false after writing the error.</summary>
    public static bool Emit(string text, string? outFile, TextWriter output, TextWriter error)
    {
        if (outFile is null)
        {
            output.Write(text);
            return true;
        }

        try
        {
            File.WriteAllText(outFile, text);
            return true;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            error.WriteLine($"{outFile}: error: cannot write: {ex.Message}");
            return false;
        }
    }

    private static void Report(TextWriter error, string file, IssueReport issue) => error.WriteLine($"{file}: {issue}");
}
