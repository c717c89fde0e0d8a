using LoopShaper.Core.Design;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The closed-loop load-step and reference-step responses, redrawn on every new analysis.</summary>
public sealed partial class StepChart
{
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private DesignAnalysis? _builtFrom;
    private LiveChart? _live;

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
            _live?.Show(_figure, Analysis); // sent now (with the loop-gain chart's redraw of the same analysis), not when its turn in the render comes
            _builtFrom = Analysis;
        }
    }
}
