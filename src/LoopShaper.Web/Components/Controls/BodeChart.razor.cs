using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Web;
using Plotly.Blazor.Interop;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The loop-gain Bode chart, redrawn (through <see cref="LiveChart"/>) when the analysis changes; compensator markers
/// are selected by clicking them (or their name) and nudged with the arrow keys.
/// </summary>
public sealed partial class BodeChart
{
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private LiveChart? _live;
    private DesignAnalysis? _drawnAnalysis;
    private BodeTraces _drawnShow = new();
    private PlacementTarget? _drawnSelected;
    private MeasuredSet? _drawnMeasured;

    /// <summary>The analysis to show.</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis Analysis { get; set; } = default!;

    /// <summary>The form (for the selectable quantities).</summary>
    [Parameter, EditorRequired]
    public DesignForm Form { get; set; } = default!;

    /// <summary>The selected quantity.</summary>
    [Parameter]
    public PlacementTarget? Selected { get; set; }

    /// <summary>Raised when a quantity is selected or deselected.</summary>
    [Parameter]
    public EventCallback<PlacementTarget?> OnSelect { get; set; }

    /// <summary>Raised after a nudge changed the form.</summary>
    [Parameter]
    public EventCallback OnChanged { get; set; }

    /// <summary>A measured response to draw over the model, or null.</summary>
    [Parameter]
    public MeasuredSet? Measured { get; set; }

    /// <summary>Which traces are on.</summary>
    public BodeTraces Show { get; private set; } = new();

    /// <summary>The figure last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    private IEnumerable<PlacementTarget> Targets => Form.Mode != CompensatorMode.Placement ? [] : Form.CompensatorType switch
    {
        CompensatorType.TypeI => [PlacementTarget.Gain],
        CompensatorType.TypeII => [PlacementTarget.Gain, PlacementTarget.Zero1, PlacementTarget.Pole1],
        _ => [PlacementTarget.Gain, PlacementTarget.Zero1, PlacementTarget.Zero2, PlacementTarget.Pole1, PlacementTarget.Pole2],
    };

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (!ReferenceEquals(Analysis, _drawnAnalysis) || Show != _drawnShow || Selected != _drawnSelected || !ReferenceEquals(Measured, _drawnMeasured))
        {
            _figure = BodeFigure.Build(Analysis, Show, Form.Mode == CompensatorMode.Placement ? Selected : null, MeasuredOverlay.Compare(Analysis, Measured));
            // A new analysis goes with the step chart's redraw of it (one browser task); a trace or marker change alone at once.
            _live?.Show(_figure, ReferenceEquals(Analysis, _drawnAnalysis) ? null : Analysis);
            _drawnMeasured = Measured;
            _drawnAnalysis = Analysis;
            _drawnShow = Show;
            _drawnSelected = Selected;
        }
    }

    private void OnPointClick(IEnumerable<EventDataPoint> points)
    {
        var hit = points.Select(p => _figure.TargetAt(ToIndex(p.CurveNumber), ToIndex(p.PointIndex))).FirstOrDefault(t => t is not null);
        if (hit is not null)
        {
            _ = InvokeAsync(() => OnSelect.InvokeAsync(hit));
        }
    }

    private static int ToIndex(object? value) => value switch
    {
        int i => i,
        long l => (int)l,
        double d => (int)d,
        System.Text.Json.JsonElement { ValueKind: System.Text.Json.JsonValueKind.Number } e => e.GetInt32(),
        _ => -1,
    };

    private Task SelectTarget(PlacementTarget t) => OnSelect.InvokeAsync(Selected == t ? null : t);

    private Task Toggle(ChangeEventArgs e, string trace)
    {
        bool on = e.Value is bool b && b;
        Show = trace switch
        {
            nameof(BodeTraces.Loop) => Show with { Loop = on },
            nameof(BodeTraces.Plant) => Show with { Plant = on },
            nameof(BodeTraces.IdealAmplifier) => Show with { IdealAmplifier = on },
            _ => Show with { Compensator = on },
        };
        OnParametersSet();
        return Task.CompletedTask;
    }

    private async Task OnKey(KeyboardEventArgs e)
    {
        if (e.Key == "Escape")
        {
            await OnSelect.InvokeAsync(null);
            return;
        }

        if (Selected is not PlacementTarget t || Form.Mode != CompensatorMode.Placement)
        {
            return;
        }

        int steps = e.Key switch
        {
            "ArrowRight" or "ArrowUp" => 1,
            "ArrowLeft" or "ArrowDown" => -1,
            _ => 0,
        };
        if (steps != 0 && Placement.Nudge(Form, t, steps, e.ShiftKey))
        {
            await OnChanged.InvokeAsync();
        }
    }
}
