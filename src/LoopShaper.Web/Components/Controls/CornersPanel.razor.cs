using System.Globalization;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Plotly.Blazor;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The corner table and the overlaid loop Bode of every corner. The sweep runs in the background once opened and again
/// after every new analysis (a sweep still going is cancelled); the last table stays shown while the next one runs.
/// </summary>
public sealed partial class CornersPanel : IDisposable
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private PlotlyChart? _chart;
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private ChartFigure? _firstFigure;
    private CornerTable? _figureOf;
    private DesignAnalysis? _sweptFrom;
    private bool _opened;
    private bool _onlyFailing;
    private bool _drawn;
    private bool _needsRedraw;
    private bool _disposed;
    private BackgroundRun<CornerTable>? _run;

    /// <summary>The analysis whose design is swept (a valid one).</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis Analysis { get; set; } = default!;

    /// <summary>Threads the sweep may use; null takes half the cores (the server is shared by every open workspace).</summary>
    [Parameter]
    public int? Threads { get; set; }

    /// <summary>How long a new analysis must stay the latest before it is swept, ms (the main charts come first while the engineer types).</summary>
    [Parameter]
    public int SettleMs { get; set; } = 300;

    /// <summary>The sweep.</summary>
    public BackgroundRun<CornerTable> Run => _run ??= CreateRun();

    /// <summary>The table shown, or null before the first sweep finished.</summary>
    public CornerTable? Table => Run.Result;

    /// <summary>The overlay last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    [Inject]
    private ILogger<CornersPanel> Logger { get; set; } = default!;

    /// <inheritdoc />
    public void Dispose()
    {
        _disposed = true;
        if (_run is not null)
        {
            _run.Changed -= OnRunChanged;
            _run.Dispose();
        }
    }

    /// <summary>Opens the panel and sweeps the current design.</summary>
    public Task Open()
    {
        _opened = true;
        return Sweep();
    }

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (_opened && !ReferenceEquals(Analysis, _sweptFrom))
        {
            _ = SweepWhenSettled(Analysis);
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

    private async Task SweepWhenSettled(DesignAnalysis analysis)
    {
        _sweptFrom = analysis;
        await Task.Delay(SettleMs).ConfigureAwait(true);
        if (!_disposed && ReferenceEquals(Analysis, analysis))
        {
            await Sweep();
        }
    }

    private Task Sweep()
    {
        _sweptFrom = Analysis;
        var design = Analysis.Design;
        int threads = Threads ?? Math.Max(1, Environment.ProcessorCount / 2);
        var options = new CornerSweepOptions(MaxDegreeOfParallelism: threads);
        return Run.Start((progress, token) => CornerSweep.Run(design, options, token));
    }

    private BackgroundRun<CornerTable> CreateRun()
    {
        var run = new BackgroundRun<CornerTable>(Logger);
        run.Changed += OnRunChanged;
        return run;
    }

    private void OnRunChanged() => _ = InvokeAsync(() =>
    {
        if (Table is CornerTable t && !ReferenceEquals(t, _figureOf))
        {
            var range = t.Rows.Length > 0 ? Analysis.Design.Analysis : null;
            _figure = CornerBodeFigure.Build(t, range?.StartHz ?? 0, range?.StopHz ?? 0);
            _firstFigure ??= _figure;
            _figureOf = t;
            _needsRedraw = true;
        }

        StateHasChanged();
    });

    private static string ModelName(CornerRow r) => r.Model switch
    {
        SmallSignalModel.VoltageModeContinuous or SmallSignalModel.PeakCurrentModeContinuous => "CCM",
        SmallSignalModel.VoltageModeDiscontinuous or SmallSignalModel.PeakCurrentModeDiscontinuous => "DCM",
        SmallSignalModel.Custom => "custom",
        _ => r.Mode switch { ConductionMode.Continuous => "CCM, none", ConductionMode.Discontinuous => "DCM, none", _ => "none" },
    };

    private static bool IsWorst(CornerTable t, int i, string figure) => figure switch
    {
        "crossover" => t.Worst.HighestCrossover == i,
        "pm" => t.Worst.PhaseMargin == i,
        "gm" => t.Worst.UpperGainMargin == i,
        "lgm" => t.Worst.LowerGainMargin == i,
        "dev" => t.Worst.LoadStepDeviation == i,
        "rec" => t.Worst.RecoveryTime == i,
        _ => false,
    };

    private static string? Worst(CornerTable t, int i, string figure) => IsWorst(t, i, figure) ? "worst" : null;

    private static string? WorstAttr(CornerTable t, int i, string figure) => IsWorst(t, i, figure) ? "true" : null;

    private static string FirstReason(CornerRow r)
    {
        string first = r.Failures.IsEmpty ? r.Note ?? "not analysed" : r.Failures[0];
        return r.Failures.Length > 1 ? $"{first} (+{r.Failures.Length - 1})" : first;
    }

    private static string Signed(double v) => (v < 0 ? "\u2212" : "+") + EngineeringFormat.Format(Math.Abs(v), "V");

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
