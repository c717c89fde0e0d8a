using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Exports;

/// <summary>
/// Which loop netlist matches the analysis (<see cref="SpiceNetlist.Loop"/>): the averaged CCM circuit of the
/// voltage-mode buck (Erickson and Maksimovic, 2nd ed., sec. 7.2) where the analysis uses that model, and the
/// state-space realisation of the analysed plant (<see cref="SpiceNetlist.StateSpaceLoop"/>) for peak current mode,
/// an operating point analysed with the DCM model, and a custom plant.
/// </summary>
public static class AveragedLoopSupport
{
    /// <summary>True when the design's analysis uses the voltage-mode CCM model, so the loop netlist is the averaged power-stage circuit.</summary>
    public static bool UsesAveragedCircuit(LoopDesign design)
        => design.Plant is BuckPlant { Control: VoltageModeControl } && DesignAnalyzer.BuildLoop(design).Model == SmallSignalModel.VoltageModeContinuous;
}
