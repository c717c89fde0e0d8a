namespace LoopShaper.Core.Measurements;

/// <summary>Continuous phase from a sampled, possibly wrapped phase (shared/CONVENTIONS.md: phase is continuous from the low-frequency end).</summary>
public static class PhaseUnwrapping
{
    /// <summary>
    /// Adds whole turns to each sample so that no step between neighbours exceeds 180 degrees in size; the first sample is
    /// kept as given. The same rule as numpy.unwrap with period 360 (its documentation states it).
    /// </summary>
    public static double[] Unwrap(IReadOnlyList<double> phaseDeg, out bool changed)
    {
        ArgumentNullException.ThrowIfNull(phaseDeg);
        var result = new double[phaseDeg.Count];
        double offset = 0;
        changed = false;
        for (int i = 0; i < result.Length; i++)
        {
            if (i > 0)
            {
                double step = phaseDeg[i] + offset - result[i - 1];
                double turns = Math.Round(step / 360.0, MidpointRounding.AwayFromZero);
                if (turns != 0 && Math.Abs(step) > 180.0)
                {
                    offset -= 360.0 * turns;
                    changed = true;
                }
            }

            result[i] = phaseDeg[i] + offset;
        }

        return result;
    }
}
