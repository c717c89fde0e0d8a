using LoopShaper.Core.Design;

namespace LoopShaper.Core.Synthesis;

/// <summary>The OTA parts of a design's compensator, and the design analysed again with the parts to build.</summary>
/// <param name="Design">The design as given.</param>
/// <param name="Options">The synthesis options used.</param>
/// <param name="Synthesis">Ideal, snapped and searched parts with their loop figures.</param>
/// <param name="BuiltDesign">The design with the network to build (<see cref="OtaNetworkSynthesis.ChosenNetwork"/>) as its compensator.</param>
/// <param name="BuiltAnalysis">The full analysis of <paramref name="BuiltDesign"/>: margins, steps, criteria.</param>
public sealed record OtaDesignSynthesis(LoopDesign Design, SynthesisOptions Options, OtaNetworkSynthesis Synthesis, LoopDesign BuiltDesign, DesignAnalysis BuiltAnalysis)
{
    /// <summary>True when the design with the parts to build meets every criterion.</summary>
    public bool MeetsCriteria => BuiltAnalysis.MeetsCriteria;
}
