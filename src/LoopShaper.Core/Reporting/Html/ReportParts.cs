using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Reporting.Html;

/// <summary>The parts list a report shows, and where it comes from.</summary>
/// <param name="Entries">The parts; empty when none could be given.</param>
/// <param name="Caption">Where the parts come from, or why there are none.</param>
public sealed record ReportParts(ImmutableArray<PartsListEntry> Entries, string Caption)
{
    /// <summary>
    /// The design's own parts (an op-amp network given by parts), or the standard-value parts the synthesis makes of a
    /// placement or an OTA network (the same as `export --parts`), with the design's synthesis settings.
    /// </summary>
    public static ReportParts Of(LoopDesign design)
    {
        ArgumentNullException.ThrowIfNull(design);
        var options = DesignSynthesizer.OptionsOf(design);
        switch (design.Compensator)
        {
            case OpAmpNetwork network:
                return new([.. NetworkPartsList.Of(network, options)], "The design's compensator parts, as given in the design file.");
            case TransconductanceNetwork:
                return DesignSynthesizer.TrySynthesizeOta(design, options, out var ota, out var otaIssues)
                    ? new([.. ota!.Synthesis.ChosenParts.Select(PartsListEntry.From)], "The OTA network's parts at standard values (IEC 60063), as `export --parts` writes them.")
                    : new([], "No parts list: " + string.Join("; ", otaIssues.Where(i => i.Severity == Validation.Severity.Error)));
            default:
                return DesignSynthesizer.TrySynthesize(design, options, out var result, out var issues)
                    ? new([.. result!.Synthesis.ChosenParts.Select(PartsListEntry.From)], "Standard-value parts (IEC 60063) synthesised from the compensator placement, as `export --parts` writes them.")
                    : new([], "No parts list: " + string.Join("; ", issues.Where(i => i.Severity == Validation.Severity.Error)));
        }
    }
}
