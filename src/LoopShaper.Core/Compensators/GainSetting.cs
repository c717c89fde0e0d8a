namespace LoopShaper.Core.Compensators;

/// <summary>The gain of a placed compensator: what is fixed and its value (Hz or dB by kind).</summary>
/// <param name="Kind">Which quantity is fixed.</param>
/// <param name="Value">Its value: Hz for IntegratorHz and CrossoverHz, dB for MidbandGainDb.</param>
public sealed record GainSetting(GainSettingKind Kind, double Value);
