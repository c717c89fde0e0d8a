namespace LoopShaper.Cli.Tests;

/// <summary>The command line run in-process, its standard output and error captured.</summary>
internal sealed record CliRun(int ExitCode, string Output, string Error)
{
    public static async Task<CliRun> Of(params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        int code = await Program.RunAsync(args, output, error);
        return new CliRun(code, output.ToString(), error.ToString());
    }
}
