namespace LoopShaper.Core.Compensators;

/// <summary>How the gain of a placed compensator is fixed.</summary>
public enum GainSettingKind
{
    /// <summary>The integrator's unity-gain frequency fi in Hz: Gc -> 2 pi fi / s at low frequency.</summary>
    IntegratorHz,

    /// <summary>The gain of the flat part above the first zero, fi / fz1, in dB (Type II and III).</summary>
    MidbandGainDb,

    /// <summary>The loop crossover frequency in Hz: the gain is solved so that |T| = 1 there.</summary>
    CrossoverHz,
}
