using LoopShaper.Core.Design;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Plotly.Blazor;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Closed-loop performance in the frequency domain: output impedance and audio susceptibility, open against closed
/// loop, at the main operating point or at any corner the core analysed. Redrawn with Plotly.react on every change.
/// </summary>
public sealed partial class ClosedLoopPanel
{
    /// <summary>Value of the selector's main-analysis entry.</summary>
    public const string MainChoice = "main";

    private PlotlyChart? _chart;
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private ChartFigure? _firstFigure;
    private DesignAnalysis? _builtFrom;
    private string? _builtChoice;
    private bool _drawn;
    private bool _needsRedraw;

    /// <summary>The analysis to show.</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis Analysis { get; set; } = default!;

    /// <summary>The selected operating point: <see cref="MainChoice"/> or a corner's key.</summary>
    public string Choice { get; private set; } = MainChoice;

    /// <summary>The curves drawn, or null when the selected point has none.</summary>
    public ClosedLoopCurves? Curves { get; private set; }

    /// <summary>The figure last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    /// <summary>Selector key of a corner.</summary>
    public static string Key(CornerResult corner) => corner.Input + "-" + corner.Load;

    private string MainLabel => Analysis.Design.Plant is LoopShaper.Core.PlantModels.BuckPlant buck
        ? Describe(DesignAnalyzer.ConditionOf(buck.PowerStage, Analysis.Design.Analysis))
        : "custom plant";

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (Choice != MainChoice && !Analysis.Corners.Any(c => Key(c) == Choice && c.Model is not null))
        {
            Choice = MainChoice;
        }

        if (!ReferenceEquals(Analysis, _builtFrom) || Choice != _builtChoice)
        {
            var corner = Analysis.Corners.FirstOrDefault(c => Key(c) == Choice);
            Curves = corner is null ? ClosedLoopCurves.Of(Analysis) : ClosedLoopCurves.At(Analysis, corner);
            _figure = ClosedLoopFigure.Build(Curves, Analysis.Design.Analysis.StartHz, Analysis.Design.Analysis.StopHz);
            _firstFigure ??= _figure;
            _builtFrom = Analysis;
            _builtChoice = Choice;
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

    private static string CornerLabel(CornerResult c)
        => $"{c.Input.ToString().ToLowerInvariant()} input, {(c.Load == LoadCorner.Min ? "lightest" : "full")} load: {Describe(c.Condition)}"
            + (c.Model is null ? " (no model)" : string.Empty);

    private static string Describe(LoopShaper.Core.PlantModels.OperatingCondition at)
        => EngineeringFormat.Format(at.InputVoltageV, "V") + ", " + EngineeringFormat.Format(at.LoadCurrentA, "A");

    private void OnCorner(ChangeEventArgs e)
    {
        Choice = e.Value?.ToString() ?? MainChoice;
        OnParametersSet();
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
