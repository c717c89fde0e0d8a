using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Core.Exports;

/// <summary>The parts list of an op-amp network given by its values (not synthesised): designators, roles and tolerances.</summary>
public static class NetworkPartsList
{
    /// <summary>
    /// One entry per part of the network (<see cref="OpAmpNetworkParts.Of"/>). The series is the options' series for
    /// the kind when the value is one of its preferred values, else the coarsest series offered for the kind that holds
    /// it (IEC 60063), else none; the tolerance is the options' for the part.
    /// </summary>
    public static ImmutableArray<PartsListEntry> Of(OpAmpNetwork network, SynthesisOptions options)
        => [.. OpAmpNetworkParts.Of(network).Select(p => new PartsListEntry(p.Designator, p.Kind, p.Value, SeriesOf(p.Value, p.Kind, options), options.ToleranceOf(p.Designator, p.Kind).TolerancePct, p.Role))];

    private static ESeries? SeriesOf(double value, PartKind kind, SynthesisOptions o)
    {
        var preferred = kind == PartKind.Resistor ? o.ResistorSeries : o.CapacitorSeries;
        if (StandardValues.IsPreferred(value, preferred))
        {
            return preferred;
        }

        var offered = kind == PartKind.Resistor ? SynthesisOptions.ResistorSeriesAllowed : SynthesisOptions.CapacitorSeriesAllowed;
        return offered.Where(s => StandardValues.IsPreferred(value, s)).Select(s => (ESeries?)s).FirstOrDefault();
    }
}
