namespace LoopShaper.Core.PlantModels;

/// <summary>A voltage-mode buck: power stage, modulator and feedback divider.</summary>
/// <param name="PowerStage">The power stage.</param>
/// <param name="Control">The PWM modulator.</param>
/// <param name="Feedback">The output divider and reference.</param>
public sealed record BuckPlant(BuckPowerStage PowerStage, VoltageModeControl Control, FeedbackDivider Feedback) : Plant;
