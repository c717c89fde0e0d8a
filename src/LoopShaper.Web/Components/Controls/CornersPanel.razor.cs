using System.Globalization;
using LoopShaper.Core.Corners;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The corner table and the overlaid loop Bode of every corner, from the workspace's <see cref="CornerWatch"/> (swept in
/// the background after every settled change); the last table stays shown while the next one runs.
/// </summary>
public sealed partial class CornersPanel : IDisposable
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private CornerTable? _figureOf;
    private CornerWatch? _subscribed;
    private bool _onlyFailing;

    /// <summary>The corner sweep of the open design.</summary>
    [Parameter, EditorRequired]
    public CornerWatch Watch { get; set; } = default!;

    /// <summary>The sweep.</summary>
    public BackgroundRun<CornerTable> Run => Watch.Run;

    /// <summary>The table shown, or null before the first sweep finished.</summary>
    public CornerTable? Table => Run.Result;

    /// <summary>The overlay last sent to the chart.</summary>
    public ChartFigure Figure => _figure;

    /// <inheritdoc />
    public void Dispose()
    {
        if (_subscribed is not null)
        {
            _subscribed.Changed -= OnRunChanged;
        }
    }

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (!ReferenceEquals(Watch, _subscribed))
        {
            if (_subscribed is not null)
            {
                _subscribed.Changed -= OnRunChanged;
            }

            _subscribed = Watch;
            Watch.Changed += OnRunChanged;
            UpdateFigure();
        }
    }

    private void UpdateFigure()
    {
        if (Table is CornerTable t && !ReferenceEquals(t, _figureOf))
        {
            var range = Watch.SweptFrom?.Design.Analysis;
            _figure = CornerBodeFigure.Build(t, range?.StartHz ?? 0, range?.StopHz ?? 0);
            _figureOf = t;
        }
    }

    private void OnRunChanged() => _ = InvokeAsync(() =>
    {
        UpdateFigure();
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
}
