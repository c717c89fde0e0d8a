using LoopShaper.Core.Compensators;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Design;

/// <summary>The words the design file uses for each choice (docs/design-file.md), shared by reader and writer.</summary>
internal static class DesignFileWords
{
    public static readonly IReadOnlyList<(string Word, InputCorner Value)> InputCorners =
        [("min", InputCorner.Min), ("nominal", InputCorner.Nominal), ("max", InputCorner.Max)];

    public static readonly IReadOnlyList<(string Word, LoadCorner Value)> LoadCorners =
        [("min", LoadCorner.Min), ("nominal", LoadCorner.Nominal), ("max", LoadCorner.Max)];

    public static readonly IReadOnlyList<(string Word, RectifierKind Value)> RectifierKinds =
        [("synchronous", RectifierKind.Synchronous), ("diode", RectifierKind.Diode)];

    public static readonly IReadOnlyList<(string Word, CustomPlantForm Value)> CustomPlantForms =
        [("coefficients", CustomPlantForm.Coefficients), ("factors", CustomPlantForm.Factors)];

    public static readonly IReadOnlyList<(string Word, CompensatorType Value)> CompensatorTypes =
        [("typeI", CompensatorType.TypeI), ("typeII", CompensatorType.TypeII), ("typeIII", CompensatorType.TypeIII)];

    public static readonly IReadOnlyList<(string Word, GainSettingKind Value)> GainKinds =
        [("integratorHz", GainSettingKind.IntegratorHz), ("midbandGainDb", GainSettingKind.MidbandGainDb), ("crossoverHz", GainSettingKind.CrossoverHz)];

    public static readonly IReadOnlyList<(string Word, PlantModel Value)> PlantModelWords =
        [("buck", PlantModel.Buck), ("custom", PlantModel.Custom)];

    public static readonly IReadOnlyList<(string Word, CompensatorForm Value)> CompensatorForms =
        [("placement", CompensatorForm.Placement), ("opAmpNetwork", CompensatorForm.OpAmpNetwork), ("ota", CompensatorForm.Ota)];

    public static readonly IReadOnlyList<(string Word, ControlScheme Value)> ControlSchemes =
        [("voltageMode", ControlScheme.VoltageMode), ("peakCurrentMode", ControlScheme.PeakCurrentMode)];

    public static readonly IReadOnlyList<(string Word, CompensationRampKind Value)> RampKinds =
        [("slope", CompensationRampKind.VoltsPerSecond), ("multipleOfOffSlope", CompensationRampKind.MultipleOfOffSlope), ("mc", CompensationRampKind.Mc)];

    public static readonly IReadOnlyList<(string Word, AmplifierKind Value)> AmplifierKinds =
        [("ideal", AmplifierKind.Ideal), ("opAmp", AmplifierKind.OpAmp)];

    public static readonly IReadOnlyList<(string Word, ConductionModelChoice Value)> ConductionModels =
        [("automatic", ConductionModelChoice.Automatic), ("ccm", ConductionModelChoice.Continuous), ("dcm", ConductionModelChoice.Discontinuous)];

    /// <summary>plant.model.</summary>
    public enum PlantModel
    {
        /// <summary>The built-in buck power stage.</summary>
        Buck,

        /// <summary>A transfer function given by hand.</summary>
        Custom,
    }

    /// <summary>compensator.form.</summary>
    public enum CompensatorForm
    {
        /// <summary>Poles, zeros and a gain setting.</summary>
        Placement,

        /// <summary>An op-amp network given by its parts.</summary>
        OpAmpNetwork,

        /// <summary>A transconductance amplifier with its network to ground (version 2).</summary>
        Ota,
    }

    /// <summary>compensator.amplifier.kind of an op-amp network.</summary>
    public enum AmplifierKind
    {
        /// <summary>Infinite gain and bandwidth.</summary>
        Ideal,

        /// <summary>Finite open-loop gain and gain-bandwidth (version 2).</summary>
        OpAmp,
    }

    /// <summary>plant.control.scheme.</summary>
    public enum ControlScheme
    {
        /// <summary>Voltage-mode PWM.</summary>
        VoltageMode,

        /// <summary>Peak current mode (version 2).</summary>
        PeakCurrentMode,
    }

    /// <summary>The word for a value.</summary>
    public static string WordOf<T>(IReadOnlyList<(string Word, T Value)> words, T value)
        where T : struct, Enum
        => words.First(w => EqualityComparer<T>.Default.Equals(w.Value, value)).Word;
}
