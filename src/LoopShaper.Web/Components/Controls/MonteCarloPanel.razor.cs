using System.Globalization;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Monte Carlo over the design's tolerances: the run goes on the thread pool with a progress bar and a cancel button;
/// the yield, the percentiles, the histograms and the worst samples come from the core's <see cref="MonteCarloResult"/>.
/// A worst sample replaces the open design only when its button is clicked, and the design it replaces can be reopened.
/// </summary>
public sealed partial class MonteCarloPanel : IDisposable
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private MonteCarloResult? _figureOf;
    private BackgroundRun<MonteCarloResult>? _run;
    private LoopDesign? _previous;
    private int _openedIndex;

    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    /// <summary>Threads the run may use; null takes half the cores (the server is shared by every open workspace).</summary>
    [Parameter]
    public int? Threads { get; set; }

    /// <summary>The inputs.</summary>
    public MonteCarloRequest Request { get; } = new();

    /// <summary>The run.</summary>
    public BackgroundRun<MonteCarloResult> Run => _run ??= CreateRun();

    /// <summary>The histograms last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    private DesignAnalysis? Analysis => Workspace.Analysis;

    private string StatusText => Run.IsRunning
        ? $"{(100 * Run.Progress).ToString("F0", Inv)} % of {Request.SamplesText.Trim()} samples"
        : Run.Result is { CancelStopS: double halt }
            ? $"cancelled: sampling stopped {Seconds(halt)} after the request, partial result ready after {Seconds(Run.StopLatency?.TotalSeconds ?? 0)}, at {(100 * Run.Progress).ToString("F0", Inv)} %"
            : $"cancelled: stopped {Seconds(Run.StopLatency?.TotalSeconds ?? 0)} after the request, at {(100 * Run.Progress).ToString("F0", Inv)} %";

    [Inject]
    private ILogger<MonteCarloPanel> Logger { get; set; } = default!;

    /// <inheritdoc />
    public void Dispose()
    {
        if (_run is not null)
        {
            _run.Changed -= OnRunChanged;
            _run.Dispose();
        }
    }

    /// <summary>Starts a run over the open design (a run still going is cancelled first).</summary>
    public Task Start()
    {
        if (Analysis is not { IsValid: true } analysis || Request.ToSettings(Threads ?? Math.Max(1, Environment.ProcessorCount / 2)) is not MonteCarloSettings settings)
        {
            return Task.CompletedTask;
        }

        var design = analysis.Design;
        return Run.Start((progress, token) => MonteCarloRunner.Run(design, settings, new RelayProgress<MonteCarloProgress>(p => progress.Report(p.Fraction)), token));
    }

    /// <summary>Asks the run to stop.</summary>
    public void Cancel() => Run.Cancel();

    /// <summary>Opens a sample as the design, keeping the current one to reopen.</summary>
    public async Task OpenSample(MonteCarloResult result, MonteCarloSample sample)
    {
        if (Analysis is not { IsValid: true } analysis)
        {
            return;
        }

        var opened = MonteCarloRunner.ToDesign(analysis.Design, result, sample);
        _previous = Workspace.Form.Build();
        _openedIndex = sample.Index;
        await Workspace.LoadAsync(opened with { Name = $"{analysis.Design.Name} · sample {sample.Index}" });
    }

    private async Task RestorePrevious()
    {
        if (_previous is LoopDesign previous)
        {
            _previous = null;
            await Workspace.LoadAsync(previous);
        }
    }

    private void OnDistribution(ChangeEventArgs e)
    {
        if (Enum.TryParse<SampleDistribution>(e.Value?.ToString(), out var d))
        {
            Request.Distribution = d;
        }
    }

    private BackgroundRun<MonteCarloResult> CreateRun()
    {
        var run = new BackgroundRun<MonteCarloResult>(Logger);
        run.Changed += OnRunChanged;
        return run;
    }

    private void OnRunChanged() => _ = InvokeAsync(() =>
    {
        if (Run.Result is MonteCarloResult r && !ReferenceEquals(r, _figureOf))
        {
            double? fs = Analysis?.Design.Plant is BuckPlant b ? b.PowerStage.SwitchingFrequencyHz : null;
            _figure = HistogramFigure.Build(r, Analysis?.Design.Criteria ?? new DesignCriteria(), fs);
            _figureOf = r;
        }

        StateHasChanged();
    });

    private static string FigureName(string figure) => figure switch
    {
        "crossoverHz" => "crossover",
        "phaseMarginDeg" => "phase margin",
        "upperGainMarginDb" => "gain margin",
        "lowerGainMarginDb" => "lower gain margin",
        _ => figure,
    };

    private static string Value(string figure, double v) => !double.IsFinite(v) ? "—" : figure switch
    {
        "crossoverHz" => EngineeringFormat.Format(v, "Hz"),
        "phaseMarginDeg" => v.ToString("F1", Inv) + " °",
        _ => v.ToString("F1", Inv) + " dB",
    };

    private static string UnitOf(ToleranceParameter p) => p.Kind switch
    {
        ToleranceKind.Inductance => "H",
        ToleranceKind.Capacitance => "F",
        ToleranceKind.Esr or ToleranceKind.Dcr => "Ohm",
        ToleranceKind.SenseGain => "Ohm",
        ToleranceKind.Transconductance => "S",
        ToleranceKind.CompensatorPart => p.Name.StartsWith('C') ? "F" : "Ohm",
        _ => string.Empty,
    };

    private static string Seconds(double s) => EngineeringFormat.Format(s, "s");

}
