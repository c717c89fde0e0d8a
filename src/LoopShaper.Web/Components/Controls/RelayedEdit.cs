using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Event handling for a control that relays its edits to its parent (an OnChanged callback): the parent's handler
/// renders the parent and with it the control, so the control does not render on its own first. ComponentBase would,
/// and that render batch would reach the browser (and may be painted) ahead of the recomputed charts.
/// </summary>
internal static class RelayedEdit
{
    /// <summary>Runs the handler; renders the control itself only when no parent takes its edits.</summary>
    public static async Task Handle(EventCallbackWorkItem callback, object? arg, bool parentRenders, Action render)
    {
        await callback.InvokeAsync(arg);
        if (!parentRenders)
        {
            render();
        }
    }
}
