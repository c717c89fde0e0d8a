using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The tolerances the corner table and the Monte Carlo run vary (the design file's "tolerances" section): bands in %
/// and temperature multipliers, each field keeping its text, the core's range messages beside it. An edit goes into the
/// design, so saving, the share link, the corners and the Monte Carlo all take it.
/// </summary>
public sealed partial class TolerancesEditor
{
    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    private TolerancesForm T => Workspace.Form.Tolerances;

    private static string Hint => "What the corners (all low, all high, worst case) and the Monte Carlo samples vary. Bands are ± % of the entered value; ESR and DCR go from their lowest to their highest multiple over temperature; the DC-bias factor derates every capacitor, nominal included.";

    private Task Changed(FieldState _) => Workspace.RecomputeAsync();
}
