using System.Collections.Immutable;
using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Design;

/// <summary>What reading a design file gave: the design, or every error found with its JSON path.</summary>
/// <param name="Design">The design; null when there is any error (nothing is half-loaded).</param>
/// <param name="Errors">Syntax, type, unit, missing-field and unknown-field errors, each with its JSON path ("$.plant.powerStage.inductor.inductanceH").</param>
public sealed record DesignFileResult(LoopDesign? Design, ImmutableArray<ValidationIssue> Errors)
{
    /// <summary>True when the file was read without errors.</summary>
    public bool Succeeded => Design is not null;
}
