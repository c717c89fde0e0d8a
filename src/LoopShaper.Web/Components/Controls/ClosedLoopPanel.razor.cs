using LoopShaper.Core.Design;
using LoopShaper.Core.Loop;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Closed-loop performance at the main operating point or at any corner: output impedance and audio susceptibility,
/// open against closed loop, and the load-step, reference-step and line-step transients, from the core's
/// <see cref="ClosedLoopAnalyzer"/>. Computed off the circuit's thread; redrawn with Plotly.react.
/// </summary>
public sealed partial class ClosedLoopPanel : IDisposable
{
    private ChartFigure _frequency = ClosedLoopFigure.Build(null, 0, 0);
    private ChartFigure _transient = TransientFigure.Build(null);
    private DesignAnalysis? _builtFrom;
    private string? _builtChoice;
    private CancellationTokenSource? _cts;
    private bool _computing;
    private string? _error;

    /// <summary>The analysis whose design is shown (a valid one).</summary>
    [Parameter, EditorRequired]
    public DesignAnalysis Analysis { get; set; } = default!;

    /// <summary>
    /// How long the design must stay unchanged before it is analysed again, ms: while the engineer types or drags,
    /// this panel waits and leaves both cores to the loop-gain and step charts. The first analysis and a chosen
    /// operating point start at once.
    /// </summary>
    [Parameter]
    public int SettleMs { get; set; } = DesignerDefaults.SettleMs;

    /// <summary>The selected operating point: <see cref="ClosedLoopPoint.Main"/> or a corner's key.</summary>
    public string Choice { get; private set; } = ClosedLoopPoint.Main;

    /// <summary>The performance drawn, or null before the first one.</summary>
    public ClosedLoopPerformance? Performance { get; private set; }

    /// <summary>The frequency-domain figure last sent.</summary>
    public ChartFigure FrequencyFigure => _frequency;

    /// <summary>The transient figure last sent.</summary>
    public ChartFigure TransientFigureSent => _transient;

    /// <summary>Completes when the latest computation has been applied.</summary>
    public Task Computed { get; private set; } = Task.CompletedTask;

    [Inject]
    private ILogger<ClosedLoopPanel> Logger { get; set; } = default!;

    private string MainLabel => ClosedLoopPoint.MainCondition(Analysis.Design) is { } at
        ? EngineeringFormat.Format(at.InputVoltageV, "V") + ", " + EngineeringFormat.Format(at.LoadCurrentA, "A")
        : "custom plant";

    /// <inheritdoc />
    public void Dispose()
    {
        _cts?.Cancel();
        _cts?.Dispose();
    }

    /// <inheritdoc />
    protected override async Task OnParametersSetAsync()
    {
        if (!ReferenceEquals(Analysis, _builtFrom) || Choice != _builtChoice)
        {
            await Recompute(_builtFrom is null ? 0 : SettleMs);
        }
    }

    private async Task Recompute(int settleMs)
    {
        _builtFrom = Analysis;
        _builtChoice = Choice;
        _cts?.Cancel();
        _cts?.Dispose();
        var cts = _cts = new CancellationTokenSource();
        var design = Analysis.Design;
        string key = Choice;
        _computing = true;
        var work = Task.Run(
            async () =>
            {
                if (settleMs > 0)
                {
                    await Task.Delay(settleMs, cts.Token).ConfigureAwait(false);
                }

                return ClosedLoopPoint.Analyze(design, key, cts.Token);
            },
            cts.Token);
        Computed = work.ContinueWith(_ => { }, TaskScheduler.Default);
        try
        {
            var p = await work.ConfigureAwait(true);
            if (cts.IsCancellationRequested)
            {
                return;
            }

            Performance = p;
            _error = null;
            _frequency = ClosedLoopFigure.Build(p, design.Analysis.StartHz, design.Analysis.StopHz);
            _transient = TransientFigure.Build(p);
        }
        catch (OperationCanceledException)
        {
            return;
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            Logger.LogWarning(ex, "Closed-loop performance at {Point} failed", key);
            Performance = null;
            _error = "Not computed at this point: " + ex.Message;
            _frequency = ClosedLoopFigure.Build(null, design.Analysis.StartHz, design.Analysis.StopHz);
            _transient = TransientFigure.Build(null);
        }

        _computing = false;
    }

    private async Task OnCorner(ChangeEventArgs e)
    {
        Choice = e.Value?.ToString() ?? ClosedLoopPoint.Main;
        await Recompute(0);
    }

}
