using LoopShaper.Core.Design;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Two designs overlaid on a Bode chart of their loop gains and on their step responses. Drawn once: the compare
/// panel gives each comparison a new instance (a new <c>@key</c>), so the chart's own first draw shows it.
/// </summary>
public sealed partial class CompareChart
{
    private ChartFigure _bode = new([], new Plotly.Blazor.Layout(), []);
    private ChartFigure _steps = new([], new Plotly.Blazor.Layout(), []);

    /// <summary>Design A's analysis.</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis A { get; set; } = default!;

    /// <summary>Design B's analysis.</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis B { get; set; } = default!;

    /// <summary>Legend name of A.</summary>
    [Parameter, EditorRequired]
    public string LabelA { get; set; } = "A";

    /// <summary>Legend name of B.</summary>
    [Parameter, EditorRequired]
    public string LabelB { get; set; } = "B";

    /// <summary>The Bode figure sent to the chart.</summary>
    public ChartFigure BodeFigure => _bode;

    /// <summary>The step figure sent to the chart.</summary>
    public ChartFigure StepFigure => _steps;

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        _bode = CompareFigure.Bode(A, LabelA, B, LabelB);
        _steps = CompareFigure.Steps(A, LabelA, B, LabelB);
    }
}
