namespace LoopShaper.Core.PlantModels;

/// <summary>How a custom plant's transfer function is written.</summary>
public enum CustomPlantForm
{
    /// <summary>Numerator and denominator coefficients in descending powers of s.</summary>
    Coefficients,

    /// <summary>Low-frequency gain, roots at the origin, and zeros and poles in Hz.</summary>
    Factors,
}
