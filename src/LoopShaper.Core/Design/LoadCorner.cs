namespace LoopShaper.Core.Design;

/// <summary>Which load current an analysis uses.</summary>
public enum LoadCorner
{
    /// <summary>Lightest load.</summary>
    Min,

    /// <summary>Full load.</summary>
    Max,

    /// <summary>Nominal load (plant.powerStage.loadCurrentA.nominal, or the mean of the lightest and full load).</summary>
    Nominal,
}
