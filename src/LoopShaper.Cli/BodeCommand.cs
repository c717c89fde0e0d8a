using System.CommandLine;
using LoopShaper.Core.Reporting;

namespace LoopShaper.Cli;

/// <summary>`bode FILE [--out FILE.csv]`: plant, compensator and loop gain as a CSV table.</summary>
internal static class BodeCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var outFile = new Option<string?>("--out", "-o") { Description = "Write the CSV to this file instead of the standard output." };
        var command = new Command("bode", $"Write magnitude (dB) and continuous phase (degrees) of plant, compensator and loop gain as CSV with the header {BodeTable.CsvHeader}. Exit code 0 when written, 2 for invalid input.")
        {
            file, outFile,
        };
        command.SetAction(parse =>
        {
            var analysis = DesignLoader.Analyze(parse.GetValue(file)!, error);
            if (analysis is null || BodeTable.From(analysis) is not { } table)
            {
                return ExitCodes.InvalidInput;
            }

            return DesignLoader.Emit(table.ToCsv(), parse.GetValue(outFile), output, error) ? ExitCodes.Success : ExitCodes.InvalidInput;
        });
        return command;
    }
}
