using LoopShaper.Core.Design;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Plotly.Blazor;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The closed-loop load-step and reference-step responses, redrawn with Plotly.react on every new analysis.</summary>
public sealed partial class StepChart
{
    private PlotlyChart? _chart;
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private ChartFigure? _firstFigure;
    private DesignAnalysis? _builtFrom;
    private bool _drawn;
    private bool _needsRedraw;

    /// <summary>The analysis to show.</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis Analysis { get; set; } = default!;

    /// <summary>The figure last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (!ReferenceEquals(Analysis, _builtFrom))
        {
            _figure = StepFigure.Build(Analysis);
            _firstFigure ??= _figure;
            _builtFrom = Analysis;
            _needsRedraw = true;
        }
    }

    /// <inheritdoc />
    protected override async Task OnAfterRenderAsync(bool firstRender)
    {
        if (_drawn && _needsRedraw && _chart is not null)
        {
            _needsRedraw = false;
            await _chart.React();
        }
    }

    private async void OnFirstDraw()
    {
        _drawn = true;
        if (_chart is null || ReferenceEquals(_figure, _firstFigure))
        {
            return;
        }

        try
        {
            _needsRedraw = false;
            await _chart.React();
        }
        catch (Exception ex) when (ex is Microsoft.JSInterop.JSDisconnectedException or Microsoft.JSInterop.JSException or TaskCanceledException)
        {
            // The circuit or the chart went away; nothing to draw into.
        }
    }
}
