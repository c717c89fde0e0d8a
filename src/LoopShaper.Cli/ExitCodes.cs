namespace LoopShaper.Cli;

/// <summary>Process exit codes of the command line.</summary>
public static class ExitCodes
{
    /// <summary>Done: the design meets its criteria (analyze) or the output was written (bode).</summary>
    public const int Success = 0;

    /// <summary>The design was analysed but does not meet every criterion.</summary>
    public const int CriteriaNotMet = 1;

    /// <summary>Invalid input: bad command line, unreadable or invalid design file, output not writable.</summary>
    public const int InvalidInput = 2;
}
