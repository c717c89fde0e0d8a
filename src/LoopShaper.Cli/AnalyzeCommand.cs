using System.CommandLine;
using LoopShaper.Core.Reporting;

namespace LoopShaper.Cli;

/// <summary>`analyze FILE [--format text|json] [--out FILE]`: the full analysis of a design file.</summary>
internal static class AnalyzeCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var format = new Option<string>("--format", "-f") { Description = "Report format: text or json.", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong("text", "json");
        var outFile = new Option<string?>("--out", "-o") { Description = "Write the report to this file instead of the standard output." };
        var command = new Command("analyze", "Analyse a design: operating point, crossovers and margins, closed-loop stability, step responses, criteria and warnings. The corner table (3 input x 3 load x 4 tolerance sets) is included. Exit code 0 when the design meets its criteria at every corner, 1 when not, 2 for invalid input.")
        {
            file, format, outFile,
        };
        command.SetAction(parse =>
        {
            var analysis = DesignLoader.Analyze(parse.GetValue(file)!, error);
            if (analysis is null)
            {
                return ExitCodes.InvalidInput;
            }

            var report = AnalysisReport.WithCorners(analysis);
            string text = parse.GetValue(format) == "json" ? AnalysisReportJson.Write(report) : AnalysisReportText.Write(report);
            if (!DesignLoader.Emit(text, parse.GetValue(outFile), output, error))
            {
                return ExitCodes.InvalidInput;
            }

            return report.MeetsCriteria && report.CornerTable?.AllPass != false ? ExitCodes.Success : ExitCodes.CriteriaNotMet;
        });
        return command;
    }
}
