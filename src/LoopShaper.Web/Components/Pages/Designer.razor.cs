using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;
using LoopShaper.Web.Components.Controls;
using Microsoft.AspNetCore.Components;
using Microsoft.JSInterop;

namespace LoopShaper.Web.Components.Pages;

/// <summary>
/// The workspace: inputs on the left, the summary, the loop-gain chart, the step responses and the derivations on
/// the right. Every change recomputes through the core; this page only moves text between the form and the panels.
/// </summary>
public sealed partial class Designer : IAsyncDisposable, IHandleEvent
{
    /// <summary>Name of the top-bar section the file actions render into.</summary>
    public const string TopBarSection = "topbar-actions";

    private bool _interactive;

    // The derivations card, closed until asked for (see DerivationView.Open).
    private bool _derivationsOpen;

    private int _renders;
    private string? _linkError;
    private MeasuredSet? _measured;
    private ChartRedrawGroup _redraws = default!;

    /// <summary>A design packed by <see cref="ShareToken"/>, from a share link.</summary>
    [SupplyParameterFromQuery(Name = ShareToken.QueryName)]
    public string? DesignToken { get; set; }

    /// <summary>The open design (created on initialisation).</summary>
    public DesignWorkspace Workspace { get; private set; } = default!;

    /// <summary>The corner sweep of the open design (created with the workspace).</summary>
    public CornerWatch Corners { get; private set; } = default!;

    /// <summary>The loop-gain and step charts' redraws (created on initialisation).</summary>
    internal ChartRedrawGroup Redraws => _redraws;

    /// <summary>The parts of the open design (created with the workspace).</summary>
    public PartsWorkspace Parts { get; private set; } = default!;

    [Inject]
    private DemoDesign Demo { get; set; } = default!;

    [Inject]
    private ILogger<Designer> Logger { get; set; } = default!;

    [Inject]
    private IJSRuntime Js { get; set; } = default!;

    private DesignForm Form => Workspace.Form;

    private FieldIssues Issues => Workspace.Issues;

    private int UnreadableCount => Form.UnreadableFields.Count();

    private string? ChartState => Workspace.ComputationError
        ?? (Workspace.Analysis is null ? "Computing…"
            : !Workspace.Analysis.IsValid ? "No chart: the design has input errors (marked in red beside the fields)." : null);

    private static readonly string[] GroupPaths =
    [
        "plant", "plant.powerStage", "plant.powerStage.inputVoltageV", "plant.powerStage.loadCurrentA", "plant.powerStage.inductor",
        "plant.powerStage.rectifier", "plant.powerStage.outputCapacitors", "plant.control", "plant.feedback", "compensator", "compensator.gain",
        "compensator.gain.kind", "analysis", "criteria", "synthesis",
    ];

    private IReadOnlyList<ValidationIssue> OtherFindings
        => [.. Issues.Except(Form.ActiveFields.Select(f => f.Path).Concat(GroupPaths))];

    /// <inheritdoc />
    public ValueTask DisposeAsync()
    {
        Workspace.Changed -= OnWorkspaceChanged;
        Parts.Changed -= OnWorkspaceChanged;
        Parts.Dispose();
        Corners.Changed -= OnCornersChanged;
        Corners.Dispose();
        return _redraws.DisposeAsync();
    }

    /// <summary>
    /// An event renders the page once, when its handler has finished, and not at all when the handler's own workspace
    /// change has rendered it already. (The default renders after the handler's synchronous part too: the whole page,
    /// every panel and chart parameter, with the old analysis, while the new one is being computed.)
    /// </summary>
    async Task IHandleEvent.HandleEventAsync(EventCallbackWorkItem callback, object? arg)
    {
        int before = _renders;
        await callback.InvokeAsync(arg);
        if (_renders == before)
        {
            StateHasChanged();
        }
    }

    /// <inheritdoc />
    protected override bool ShouldRender()
    {
        _renders++;
        return true;
    }

    /// <inheritdoc />
    protected override async Task OnInitializedAsync()
    {
        _redraws = new ChartRedrawGroup(Js, Logger);
        var design = Demo.Design;
        if (DesignToken is not null)
        {
            if (!ShareToken.TryReadJson(DesignToken, out var json, out var error))
            {
                _linkError = "The link could not be opened: " + error + " Showing the demo design instead.";
            }
            else
            {
                var read = DesignFile.Read(json);
                if (read.Design is null)
                {
                    _linkError = "The link's design has errors: " + string.Join("; ", read.Errors.Select(e => e.ToString())) + " Showing the demo design instead.";
                }
                else
                {
                    design = read.Design;
                }
            }

            if (_linkError is not null)
            {
                Logger.LogWarning("Share link rejected: {Reason}", _linkError);
            }
        }

        Workspace = new DesignWorkspace(design, Logger);
        Workspace.Changed += OnWorkspaceChanged;
        Parts = new PartsWorkspace(Workspace, Logger);
        Parts.Changed += OnWorkspaceChanged;
        Corners = new CornerWatch(Logger);
        Corners.Changed += OnCornersChanged;
        await Workspace.RecomputeAsync();
    }

    /// <inheritdoc />
    protected override void OnAfterRender(bool firstRender)
    {
        // The charts of a new analysis went together during the render; anything still waiting (a chart whose panel
        // failed to draw its figure) goes now.
        _redraws.Flush();
        if (firstRender && RendererInfo.IsInteractive)
        {
            _interactive = true;
            StateHasChanged();
        }
    }

    private void OnWorkspaceChanged()
    {
        _ = Corners.Follow(Workspace.Analysis);
        _ = InvokeAsync(StateHasChanged);
    }

    // Only a finished (or failed) sweep changes the summary; progress is the Corners card's own business.
    private void OnCornersChanged()
    {
        if (!Corners.Run.IsRunning)
        {
            _ = InvokeAsync(StateHasChanged);
        }
    }

    private Task Recompute() => Workspace.RecomputeAsync();

    private Task Changed(FieldState _) => Workspace.RecomputeAsync();

    private void SelectTarget(PlacementTarget? target) => Workspace.Select(target);

    private void SelectOne(PlacementTarget target) => Workspace.Select(Workspace.Selected == target ? null : target);

    private Task OnName(ChangeEventArgs e)
    {
        Form.Name = e.Value?.ToString() ?? string.Empty;
        return Workspace.RecomputeAsync();
    }

    private Task OnDescription(ChangeEventArgs e)
    {
        Form.Description = e.Value?.ToString() ?? string.Empty;
        return Workspace.RecomputeAsync();
    }

    private Task OnRectifier(ChangeEventArgs e)
    {
        if (Enum.TryParse<RectifierKind>(e.Value?.ToString(), out var kind))
        {
            Form.Rectifier = kind;
        }

        return Workspace.RecomputeAsync();
    }

    private Task OnConductionModel(ChangeEventArgs e)
    {
        if (Enum.TryParse<ConductionModelChoice>(e.Value?.ToString(), out var model))
        {
            Form.ConductionModel = model;
        }

        return Workspace.RecomputeAsync();
    }

    private Task OnInputCorner(ChangeEventArgs e)
    {
        if (Enum.TryParse<InputCorner>(e.Value?.ToString(), out var corner))
        {
            Form.InputCorner = corner;
        }

        return Workspace.RecomputeAsync();
    }

    private Task OnLoadCorner(ChangeEventArgs e)
    {
        if (Enum.TryParse<LoadCorner>(e.Value?.ToString(), out var corner))
        {
            Form.LoadCorner = corner;
        }

        return Workspace.RecomputeAsync();
    }
}
