namespace LoopShaper.Core.Measurements;

/// <summary>Why a measured-response file cannot be read, located by its line (1 = the first line of the file).</summary>
/// <param name="Line">Line number, counting from 1.</param>
/// <param name="Message">What is wrong there and what is expected.</param>
public sealed record CsvLineError(int Line, string Message)
{
    /// <summary>"line 12: message".</summary>
    public override string ToString() => $"line {Line}: {Message}";
}
