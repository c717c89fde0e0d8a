using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Web;

namespace LoopShaper.Web.Components.Controls;

/// <summary>An error boundary around one panel: a failure shows a message in that panel only and is written to the server log.</summary>
public partial class PanelBoundary : ErrorBoundary
{
    /// <summary>Name of the panel, shown in the message and the log.</summary>
    [Parameter, EditorRequired]
    public string Panel { get; set; } = string.Empty;

    [Inject]
    private ILogger<PanelBoundary> Logger { get; set; } = default!;

    /// <inheritdoc />
    protected override Task OnErrorAsync(Exception exception)
    {
        Logger.LogError(exception, "Panel '{Panel}' failed", Panel);
        return Task.CompletedTask;
    }
}
