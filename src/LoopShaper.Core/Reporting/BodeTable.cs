using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;

namespace LoopShaper.Core.Reporting;

/// <summary>
/// Plant Fm Gvd, compensator Gc and loop gain T on one frequency grid (the analysis range, with extra points near
/// every pole and zero of the three), magnitude in dB and continuous phase in degrees.
/// </summary>
/// <param name="FrequencyHz">The common frequencies, Hz, ascending.</param>
/// <param name="Plant">Control voltage to output.</param>
/// <param name="Compensator">The compensator.</param>
/// <param name="Loop">The loop gain.</param>
public sealed record BodeTable(ImmutableArray<double> FrequencyHz, FrequencyResponse Plant, FrequencyResponse Compensator, FrequencyResponse Loop)
{
    /// <summary>The header line of <see cref="ToCsv"/>.</summary>
    public const string CsvHeader = "frequency_hz,plant_mag_db,plant_phase_deg,compensator_mag_db,compensator_phase_deg,loop_mag_db,loop_phase_deg";

    /// <summary>The table of an analysed design; null when the design was not analysed (input errors).</summary>
    public static BodeTable? From(DesignAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        if (analysis.Loop is not { } loop)
        {
            return null;
        }

        var a = analysis.Design.Analysis;
        var t = loop.LoopGain;
        var f = new FrequencyGrid(a.StartHz, a.StopHz, a.Points).Adaptive([loop.Plant, loop.Compensator, t]);
        return new BodeTable(f, FrequencyResponse.Of(loop.Plant, f), FrequencyResponse.Of(loop.Compensator, f), FrequencyResponse.Of(t, f));
    }

    /// <summary>Comma-separated values with a header line, culture-invariant, shortest round-trip numbers; a non-finite value (never expected) is left empty.</summary>
    public string ToCsv()
    {
        var s = new StringBuilder();
        s.Append(CsvHeader).Append('\n');
        for (int i = 0; i < FrequencyHz.Length; i++)
        {
            s.Append(N(FrequencyHz[i])).Append(',')
                .Append(N(Plant.MagnitudeDb[i])).Append(',').Append(N(Plant.PhaseDeg[i])).Append(',')
                .Append(N(Compensator.MagnitudeDb[i])).Append(',').Append(N(Compensator.PhaseDeg[i])).Append(',')
                .Append(N(Loop.MagnitudeDb[i])).Append(',').Append(N(Loop.PhaseDeg[i])).Append('\n');
        }

        return s.ToString();
    }

    private static string N(double v) => double.IsFinite(v) ? v.ToString("R", CultureInfo.InvariantCulture) : string.Empty;
}
