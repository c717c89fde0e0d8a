using System.CommandLine;

namespace LoopShaper.Cli;

/// <summary>The `loopshaper` command line: a thin shell over LoopShaper.Core.</summary>
public static class Program
{
    /// <summary>Process entry point.</summary>
    public static Task<int> Main(string[] args) => RunAsync(args, Console.Out, Console.Error);

    /// <summary>Parses and runs a command line, writing results to <paramref name="output"/> and messages to <paramref name="error"/>; returns the exit code (<see cref="ExitCodes"/>).</summary>
    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(output);
        ArgumentNullException.ThrowIfNull(error);
        var root = new RootCommand("LoopShaper: analyse the feedback loop of a DC-DC buck converter from a design file, suggest a compensator, choose its parts, export them and print a report.")
        {
            AnalyzeCommand.Create(output, error),
            BodeCommand.Create(output, error),
            SuggestCommand.Create(output, error),
            SynthesizeCommand.Create(output, error),
            ExportCommand.Create(output, error),
            MonteCarloCommand.Create(output, error),
            ReportCommand.Create(output, error),
        };
        var parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            foreach (var e in parse.Errors)
            {
                await error.WriteLineAsync($"error: {e.Message}").ConfigureAwait(false);
            }

            await error.WriteLineAsync("Run 'loopshaper --help' for the commands and options.").ConfigureAwait(false);
            return ExitCodes.InvalidInput;
        }

        return await parse.InvokeAsync(new InvocationConfiguration { Output = output, Error = error }).ConfigureAwait(false);
    }
}
