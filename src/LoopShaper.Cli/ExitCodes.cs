namespace LoopShaper.Cli;

/// <summary>Process exit codes of the command line.</summary>
public static class ExitCodes
{
    /// <summary>Done: the design meets its criteria (analyze; synthesize with the chosen parts) or the output was written (bode, suggest, export).</summary>
    public const int Success = 0;

    /// <summary>The design was analysed but does not meet every criterion (analyze; synthesize: with the chosen parts).</summary>
    public const int CriteriaNotMet = 1;

    /// <summary>Invalid input: bad command line, unreadable or invalid design file, output not writable.</summary>
    public const int InvalidInput = 2;

    /// <summary>report --pdf: the HTML was written but the PDF could not be made (chromium missing or failing).</summary>
    public const int PdfUnavailable = 3;
}
