namespace LoopShaper.Core.PlantModels;

/// <summary>A buck converter: power stage, modulator control (voltage mode or peak current mode) and feedback divider.</summary>
/// <param name="PowerStage">The power stage.</param>
/// <param name="Control">The PWM modulator: <see cref="VoltageModeControl"/> or <see cref="PeakCurrentModeControl"/>.</param>
/// <param name="Feedback">The output divider and reference.</param>
public sealed record BuckPlant(BuckPowerStage PowerStage, PwmControl Control, FeedbackDivider Feedback) : Plant;
