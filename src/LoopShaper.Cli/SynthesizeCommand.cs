using System.CommandLine;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Cli;

/// <summary>
/// `synthesize FILE [--series E96] [--cap-series E12] [--r1 10k] [--no-search] [--format text|json] [--out FILE]`:
/// the op-amp or OTA network's parts, snapped to preferred values, with the loop analysed again with them.
/// </summary>
internal static class SynthesizeCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var format = new Option<string>("--format", "-f") { Description = "Report format: text or json.", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong("text", "json");
        var outFile = new Option<string?>("--out", "-o") { Description = "Write the report to this file instead of the standard output." };
        var synthesis = new SynthesisCommandLine();
        var command = new Command("synthesize", "Compute the parts of the compensator network (op-amp Type I/II/III, or OTA Type II with gm fixed), snap each to its preferred-value series (ideal value, snapped value, error), search the neighbouring values, and analyse the loop with ideal and standard parts. Exit code 0 when the design with the chosen parts meets its criteria, 1 when not, 2 for invalid input.")
        {
            file, format, outFile,
        };
        synthesis.AddTo(command);
        command.SetAction(parse =>
        {
            string path = parse.GetValue(file)!;
            if (DesignLoader.Load(path, error) is not { } design || !synthesis.TryOptions(parse, design, error, out var options))
            {
                return ExitCodes.InvalidInput;
            }

            SynthesisReport report;
            if (design.Compensator is Core.Compensators.TransconductanceNetwork)
            {
                if (!DesignSynthesizer.TrySynthesizeOta(design, options, out var ota, out var otaIssues))
                {
                    DesignLoader.ReportAll(error, path, otaIssues.Where(i => i.Severity == Core.Validation.Severity.Error));
                    return ExitCodes.InvalidInput;
                }

                report = SynthesisReport.From(ota!);
            }
            else if (DesignSynthesizer.TrySynthesize(design, options, out var result, out var issues))
            {
                report = SynthesisReport.From(result!);
            }
            else
            {
                DesignLoader.ReportAll(error, path, issues.Where(i => i.Severity == Core.Validation.Severity.Error));
                return ExitCodes.InvalidInput;
            }

            string text = parse.GetValue(format) == "json" ? SynthesisReportJson.Write(report) : SynthesisReportText.Write(report);
            if (!DesignLoader.Emit(text, parse.GetValue(outFile), output, error))
            {
                return ExitCodes.InvalidInput;
            }

            return report.MeetsCriteria ? ExitCodes.Success : ExitCodes.CriteriaNotMet;
        });
        return command;
    }
}
