using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Measurements;

/// <summary>A frequency response read from a measurement file: samples in Hz, dB and continuous degrees, and how the file gave them.</summary>
/// <param name="Samples">Frequency (Hz, strictly rising), gain (dB) and phase (degrees, unwrapped from the first sample).</param>
/// <param name="FrequencyUnit">The unit the file gave frequencies in: "Hz", "kHz", "MHz" or "GHz".</param>
/// <param name="PhaseWasWrapped">True when the file's phase jumped by a whole turn somewhere and was unwrapped.</param>
/// <param name="IgnoredColumns">Names of the extra columns that were not read.</param>
public sealed record MeasuredResponse(FrequencyResponse Samples, string FrequencyUnit, bool PhaseWasWrapped, IReadOnlyList<string> IgnoredColumns)
{
    /// <summary>Number of samples.</summary>
    public int Count => Samples.Count;

    /// <summary>Lowest measured frequency, Hz.</summary>
    public double StartHz => Samples.FrequencyHz[0];

    /// <summary>Highest measured frequency, Hz.</summary>
    public double StopHz => Samples.FrequencyHz[^1];
}
