using LoopShaper.Core.Analysis;
using LoopShaper.Core.Loop;

namespace LoopShaper.Core.Measurements;

/// <summary>
/// A measured response set beside the model of the same quantity: the model evaluated exactly at the measured
/// frequencies, their difference, and the loop-gain margins the measurement itself gives.
/// </summary>
public sealed record MeasurementComparison
{
    /// <summary>What was measured.</summary>
    public required MeasuredQuantity Quantity { get; init; }

    /// <summary>The measurement, phase moved by <see cref="PhaseAlignmentDeg"/>.</summary>
    public required FrequencyResponse Measured { get; init; }

    /// <summary>The model of the same quantity at the measured frequencies.</summary>
    public required FrequencyResponse Model { get; init; }

    /// <summary>Measured minus model.</summary>
    public required ResponseDifference Difference { get; init; }

    /// <summary>
    /// Whole turns (a multiple of 360 degrees) added to the measured phase so that its first sample lies within 180
    /// degrees of the model's: an instrument gives phase modulo 360, the model's continuous phase fixes the turn.
    /// </summary>
    public required double PhaseAlignmentDeg { get; init; }

    /// <summary>
    /// The loop gain the measurement gives: the measured loop gain itself, or for a measured plant the measured plant
    /// times the model's compensator at the same frequencies (T = Gc Gplant; the dB and the phases add).
    /// </summary>
    public required FrequencyResponse MeasuredLoopGain { get; init; }

    /// <summary>Margins of <see cref="MeasuredLoopGain"/> from its samples (<see cref="SampledMarginFinder"/>).</summary>
    public required SampledMargins MeasuredMargins { get; init; }

    /// <summary>Compares a measurement of <paramref name="quantity"/> with the loop model of a design.</summary>
    public static MeasurementComparison Of(MeasuredResponse measured, MeasuredQuantity quantity, LoopModel loop)
    {
        ArgumentNullException.ThrowIfNull(measured);
        ArgumentNullException.ThrowIfNull(loop);
        var f = measured.Samples.FrequencyHz;
        var model = FrequencyResponse.Of(quantity == MeasuredQuantity.LoopGain ? loop.LoopGain : loop.Plant, f);
        double turns = Math.Round((model.PhaseDeg[0] - measured.Samples.PhaseDeg[0]) / 360.0, MidpointRounding.AwayFromZero);
        double alignment = 360.0 * turns;
        var aligned = new FrequencyResponse(f, measured.Samples.MagnitudeDb, [.. measured.Samples.PhaseDeg.Select(p => p + alignment)]);
        var difference = new ResponseDifference(
            f,
            [.. aligned.MagnitudeDb.Zip(model.MagnitudeDb, (m, d) => m - d)],
            [.. aligned.PhaseDeg.Zip(model.PhaseDeg, (m, d) => m - d)]);
        var measuredLoop = quantity == MeasuredQuantity.LoopGain ? aligned : aligned.Times(FrequencyResponse.Of(loop.Compensator, f));
        return new MeasurementComparison
        {
            Quantity = quantity,
            Measured = aligned,
            Model = model,
            Difference = difference,
            PhaseAlignmentDeg = alignment + 0.0,
            MeasuredLoopGain = measuredLoop,
            MeasuredMargins = SampledMarginFinder.Find(measuredLoop),
        };
    }
}
