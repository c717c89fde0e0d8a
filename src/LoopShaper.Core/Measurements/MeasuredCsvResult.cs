using System.Collections.Immutable;

namespace LoopShaper.Core.Measurements;

/// <summary>What reading a measured-response file gave: the response, or every error found with its line (nothing is half-read).</summary>
/// <param name="Response">The response; null when there is any error.</param>
/// <param name="Errors">Line-numbered errors, in file order.</param>
public sealed record MeasuredCsvResult(MeasuredResponse? Response, ImmutableArray<CsvLineError> Errors)
{
    /// <summary>True when the file was read without errors.</summary>
    public bool Succeeded => Response is not null;
}
