using LoopShaper.Core.Analysis;

namespace LoopShaper.Core.Measurements;

/// <summary>
/// Gain and phase crossovers of a sampled loop gain: a crossing lies between two neighbouring samples whose values
/// sit on either side of the level (0 dB, or -180 + k 360 degrees of the continuous phase), and is placed by linear
/// interpolation in log frequency (gain in dB and phase in degrees are nearly straight lines in log f between close
/// samples, the asymptote view of Erickson and Maksimovic, 2nd ed., sec. 8.1). Nothing is extrapolated beyond the
/// first and last sample. A value exactly on a level counts as above it, so a crossing is found once.
/// </summary>
public static class SampledMarginFinder
{
    /// <summary>The margins of a sampled loop gain (phase continuous, as <see cref="MeasuredCsvReader"/> gives it).</summary>
    public static SampledMargins Find(FrequencyResponse loop)
    {
        ArgumentNullException.ThrowIfNull(loop);
        if (loop.Count < 2)
        {
            throw new ArgumentException("A sampled response needs at least two samples.", nameof(loop));
        }

        var gain = new List<GainCrossover>();
        var phase = new List<PhaseCrossover>();
        for (int i = 0; i + 1 < loop.Count; i++)
        {
            double lf0 = Math.Log(loop.FrequencyHz[i]), lf1 = Math.Log(loop.FrequencyHz[i + 1]);
            double m0 = loop.MagnitudeDb[i], m1 = loop.MagnitudeDb[i + 1];
            double p0 = loop.PhaseDeg[i], p1 = loop.PhaseDeg[i + 1];
            if (m0 >= 0 != m1 >= 0)
            {
                double t = m0 / (m0 - m1);
                double ph = p0 + (t * (p1 - p0));
                gain.Add(new GainCrossover(Math.Exp(lf0 + (t * (lf1 - lf0))), ph, MarginAnalyzer.PhaseMarginFromPhase(ph), Falling: m1 < m0));
            }

            if (p0 == p1)
            {
                continue;
            }

            double lo = Math.Min(p0, p1), hi = Math.Max(p0, p1);
            for (double k = Math.Ceiling((lo + 180.0) / 360.0); k <= Math.Floor((hi + 180.0) / 360.0); k++)
            {
                double level = -180.0 + (360.0 * k);
                if (p0 >= level == p1 >= level)
                {
                    continue;
                }

                double t = (level - p0) / (p1 - p0);
                double db = m0 + (t * (m1 - m0));
                phase.Add(new PhaseCrossover(Math.Exp(lf0 + (t * (lf1 - lf0))), level, db, -db));
            }
        }

        phase.Sort((x, y) => x.FrequencyHz.CompareTo(y.FrequencyHz));
        return new SampledMargins
        {
            StartHz = loop.FrequencyHz[0],
            StopHz = loop.FrequencyHz[^1],
            GainCrossovers = [.. gain],
            PhaseCrossovers = [.. phase],
        };
    }
}
