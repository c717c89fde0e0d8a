namespace LoopShaper.Core.PlantModels;

/// <summary>What the compensator controls: a modelled power stage or a transfer function given by hand.</summary>
public abstract record Plant;
