using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Library.Tests;

/// <summary>Small edits of a design, as an engineer makes them between saves.</summary>
public static class Edits
{
    /// <summary>The design with another inductance.</summary>
    public static LoopDesign WithInductance(this LoopDesign d, double inductanceH)
    {
        var buck = (BuckPlant)d.Plant;
        var stage = buck.PowerStage with { Inductor = buck.PowerStage.Inductor with { InductanceH = inductanceH } };
        return d with { Plant = buck with { PowerStage = stage } };
    }

    /// <summary>The design's inductance.</summary>
    public static double InductanceH(this LoopDesign d) => ((BuckPlant)d.Plant).PowerStage.Inductor.InductanceH;
}
