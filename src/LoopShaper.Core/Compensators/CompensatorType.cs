namespace LoopShaper.Core.Compensators;

/// <summary>The classic error-amplifier compensator types.</summary>
public enum CompensatorType
{
    /// <summary>Integrator: one pole at the origin.</summary>
    TypeI,

    /// <summary>Integrator, one zero, one pole.</summary>
    TypeII,

    /// <summary>Integrator, two zeros, two poles.</summary>
    TypeIII,
}
