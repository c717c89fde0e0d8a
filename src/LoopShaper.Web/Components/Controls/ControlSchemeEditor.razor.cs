using LoopShaper.Core.PlantModels;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The modulator inputs: the control scheme and the fields that scheme needs (ramp, sense gain, delay).</summary>
public partial class ControlSchemeEditor
{
    /// <summary>The form.</summary>
    [Parameter, EditorRequired]
    public DesignForm Form { get; set; } = default!;

    /// <summary>The core's findings.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>Raised after any change.</summary>
    [Parameter]
    public EventCallback OnChanged { get; set; }

    private Task Changed(FieldState _) => OnChanged.InvokeAsync();

    private Task OnScheme(ChangeEventArgs e)
    {
        if (Enum.TryParse<ControlScheme>(e.Value?.ToString(), out var scheme))
        {
            Form.Scheme = scheme;
        }

        return OnChanged.InvokeAsync();
    }

    private Task OnRampKind(ChangeEventArgs e)
    {
        if (Enum.TryParse<CompensationRampKind>(e.Value?.ToString(), out var kind) && kind != Form.RampKind)
        {
            // The value is kept as typed; the engineer re-enters it in the new unit.
            Form.SetRampKind(kind, null);
        }

        return OnChanged.InvokeAsync();
    }

    private Task OnFeedforward(ChangeEventArgs e)
    {
        Form.InputFeedforward = e.Value is bool b && b;
        return OnChanged.InvokeAsync();
    }
}
