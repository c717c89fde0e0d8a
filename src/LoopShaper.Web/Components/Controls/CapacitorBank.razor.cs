using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The output capacitor bank: one row per kind of capacitor, added and removed freely.</summary>
public partial class CapacitorBank
{
    /// <summary>The form holding the bank.</summary>
    [Parameter, EditorRequired]
    public DesignForm Form { get; set; } = default!;

    /// <summary>The core's findings.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>Raised after any change to the bank.</summary>
    [Parameter]
    public EventCallback OnChanged { get; set; }

    private Task Changed(FieldState _) => OnChanged.InvokeAsync();

    private Task Add()
    {
        Form.AddCapacitor();
        return OnChanged.InvokeAsync();
    }

    private Task Remove(CapacitorBranchForm branch)
    {
        Form.RemoveCapacitor(branch);
        return OnChanged.InvokeAsync();
    }

    private Task Rename(CapacitorBranchForm branch, ChangeEventArgs e)
    {
        branch.Label = e.Value?.ToString() ?? string.Empty;
        return OnChanged.InvokeAsync();
    }
}
