using LoopShaper.Core.Compensators;
using LoopShaper.Core.Corners;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Design;

/// <summary>A whole design: the plant, the compensator, what to analyse and what the loop must achieve.</summary>
/// <param name="Name">Short name of the design.</param>
/// <param name="Description">What the rail is for.</param>
/// <param name="Plant">Power stage or custom plant.</param>
/// <param name="Compensator">Compensator by placement or by parts.</param>
/// <param name="Analysis">Analysis settings.</param>
/// <param name="Criteria">Design criteria.</param>
/// <param name="Synthesis">How the compensator's parts are chosen and their tolerances; null when the design file has no "synthesis" section.</param>
/// <param name="Tolerances">Tolerances of the power stage, modulator and amplifier for corners and Monte Carlo; null when the design file has no "tolerances" section (the defaults apply).</param>
public sealed record LoopDesign(string Name, string Description, Plant Plant, Compensator Compensator, AnalysisSettings Analysis, DesignCriteria Criteria, SynthesisSettings? Synthesis = null, ToleranceSpec? Tolerances = null);
