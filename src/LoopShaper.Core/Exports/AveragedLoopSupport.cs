using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Exports;

/// <summary>
/// Whether <see cref="SpiceNetlist.AveragedLoop"/> is the loop the analysis uses: the netlist is the averaged CCM
/// circuit of the voltage-mode buck (Erickson and Maksimovic, 2nd ed., sec. 7.2), so a custom plant, peak current
/// mode and an operating point analysed with the DCM model have no netlist that matches.
/// </summary>
public static class AveragedLoopSupport
{
    /// <summary>Why the design's averaged-loop netlist would not match its analysis, with the field to change; null when it matches.</summary>
    public static ValidationIssue? ReasonAgainst(LoopDesign design)
    {
        switch (design.Plant)
        {
            case not BuckPlant:
                return new ValidationIssue("plant.model", "the averaged-loop netlist is written for the buck power stage; a custom plant has no circuit to export.");
            case BuckPlant { Control: not VoltageModeControl }:
                return new ValidationIssue("plant.control.scheme", "the averaged-loop netlist is the voltage-mode circuit; peak current mode has none here.");
        }

        var built = DesignAnalyzer.BuildLoop(design);
        return built.Model == SmallSignalModel.VoltageModeContinuous
            ? null
            : new ValidationIssue("analysis.conductionModel", "the analysed operating point uses the DCM model, and the averaged-loop netlist is the CCM circuit: analyse a load above the CCM/DCM boundary, or set analysis.conductionModel to \"ccm\" to analyse (and export) the CCM model there.");
    }
}
