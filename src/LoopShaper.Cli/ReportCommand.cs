using System.CommandLine;
using LoopShaper.Core.Reporting.Html;

namespace LoopShaper.Cli;

/// <summary>`report FILE [--out FILE] [--pdf FILE] [--paper A4|Letter]`: the printable HTML report of a design, and its PDF through headless chromium.</summary>
internal static class ReportCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var outFile = new Option<string?>("--out", "-o") { Description = "Write the HTML report to this file instead of the standard output." };
        var pdfFile = new Option<string?>("--pdf") { Description = "Also print the report to this PDF file with headless chromium." };
        var paper = new Option<string>("--paper") { Description = "Paper size of the print layout: A4 or Letter.", DefaultValueFactory = _ => "A4" };
        paper.AcceptOnlyFromAmong("A4", "Letter");
        var command = new Command("report", "Write a printable, self-contained HTML report of a design (inputs, operating point, Bode and step charts, corners, criteria, parts list, warnings, safety notice), and optionally its PDF. Exit code 0 when written, 2 for invalid input, 3 when the PDF cannot be made (chromium missing or failing).")
        {
            file, outFile, pdfFile, paper,
        };
        command.SetAction(parse =>
        {
            var analysis = DesignLoader.Analyze(parse.GetValue(file)!, error);
            if (analysis is null)
            {
                return ExitCodes.InvalidInput;
            }

            var size = parse.GetValue(paper) == "Letter" ? PaperSize.Letter : PaperSize.A4;
            string html = HtmlReportWriter.Write(analysis, new HtmlReportOptions(size, DateTimeOffset.UtcNow));
            string? htmlFile = parse.GetValue(outFile);
            string? pdf = parse.GetValue(pdfFile);
            if (!DesignLoader.Emit(html, htmlFile, output, error))
            {
                return ExitCodes.InvalidInput;
            }

            if (pdf is null)
            {
                return ExitCodes.Success;
            }

            string source = htmlFile ?? Path.Combine(Directory.CreateTempSubdirectory("loopshaper-report-").FullName, "report.html");
            if (htmlFile is null && !DesignLoader.Emit(html, source, output, error))
            {
                return ExitCodes.InvalidInput;
            }

            if (!PdfPrinter.TryPrint(source, pdf, out string why))
            {
                error.WriteLine($"{pdf}: error: {why}");
                return ExitCodes.PdfUnavailable;
            }

            return ExitCodes.Success;
        });
        return command;
    }
}
