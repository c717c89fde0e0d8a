using LoopShaper.Core.Derivations;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>Every computed quantity of the current design with its formula, the numbers put in, the result and the source, as the core recorded them.</summary>
public partial class DerivationView
{
    private string _filter = string.Empty;

    /// <summary>The derivations of the latest analysis.</summary>
    [Parameter]
    public IReadOnlyList<Derivation> Derivations { get; set; } = [];

    /// <summary>
    /// Whether the table is shown. Closed, nothing of it renders: the page re-renders on every keystroke and the table
    /// of a few dozen formulas is the largest part of it. The filter text stays while it is closed.
    /// </summary>
    [Parameter]
    public bool Open { get; set; } = true;

    private IEnumerable<Derivation> Shown => _filter.Length == 0
        ? Derivations
        : Derivations.Where(d => d.Quantity.Contains(_filter, StringComparison.OrdinalIgnoreCase)
            || d.Formula.Contains(_filter, StringComparison.OrdinalIgnoreCase)
            || d.Source.Contains(_filter, StringComparison.OrdinalIgnoreCase));
}
