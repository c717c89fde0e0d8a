using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Core.Measurements;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Forms;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// Imports a measured loop gain or plant from a CSV file (the core's <see cref="MeasuredCsvReader"/>, all or nothing,
/// errors listed with their lines), shows the margins the measurement gives beside the model's, and the difference.
/// </summary>
public sealed partial class MeasuredPanel
{
    /// <summary>Largest file read, bytes.</summary>
    public const long MaxFileBytes = 8 * 1024 * 1024;

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;
    private List<CsvLineError> _errors = [];
    private string? _rejectedFile;
    private MeasurementComparison? _comparison;
    private DesignAnalysis? _comparedAnalysis;
    private MeasuredSet? _comparedMeasured;
    private ChartFigure _figure = new([], new Plotly.Blazor.Layout(), []);
    private MeasuredQuantity _quantity = MeasuredQuantity.LoopGain;

    /// <summary>The latest analysis (null while computing).</summary>
    [Parameter]
    public DesignAnalysis? Analysis { get; set; }

    /// <summary>The imported measurement, or null.</summary>
    [Parameter]
    public MeasuredSet? Measured { get; set; }

    /// <summary>Raised with the new measurement (or null when removed).</summary>
    [Parameter]
    public EventCallback<MeasuredSet?> MeasuredChanged { get; set; }

    /// <summary>The comparison shown, or null.</summary>
    public MeasurementComparison? Comparison => _comparison;

    /// <summary>The difference figure last built.</summary>
    public ChartFigure Figure => _figure;

    private MeasuredQuantity Quantity => Measured?.Quantity ?? _quantity;

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (!ReferenceEquals(Analysis, _comparedAnalysis) || !ReferenceEquals(Measured, _comparedMeasured))
        {
            _comparedAnalysis = Analysis;
            _comparedMeasured = Measured;
            _comparison = MeasuredOverlay.Compare(Analysis, Measured);
            if (_comparison is not null)
            {
                _figure = DifferenceFigure.Build(_comparison);
            }
            else
            {
            }
        }
    }

    private async Task OnFile(InputFileChangeEventArgs e)
    {
        var file = e.File;
        if (file.Size > MaxFileBytes)
        {
            Reject(file.Name, [new CsvLineError(1, string.Create(Inv, $"the file has {file.Size} bytes; at most {MaxFileBytes} are read."))]);
            return;
        }

        using var buffer = new MemoryStream();
        await using (var stream = file.OpenReadStream(MaxFileBytes))
        {
            await stream.CopyToAsync(buffer);
        }

        var read = MeasuredCsvReader.Read(buffer.ToArray());
        if (read.Response is not { } response)
        {
            Reject(file.Name, [.. read.Errors]);
            return;
        }

        _errors = [];
        _rejectedFile = null;
        await MeasuredChanged.InvokeAsync(new MeasuredSet(response, Quantity, file.Name));
    }

    private void Reject(string fileName, List<CsvLineError> errors)
    {
        _rejectedFile = fileName;
        _errors = errors;
    }

    private async Task OnQuantity(ChangeEventArgs e)
    {
        if (!Enum.TryParse<MeasuredQuantity>(e.Value?.ToString(), out var q))
        {
            return;
        }

        _quantity = q;
        if (Measured is not null && Measured.Quantity != q)
        {
            await MeasuredChanged.InvokeAsync(Measured with { Quantity = q });
        }
    }

    private async Task Clear()
    {
        _errors = [];
        _rejectedFile = null;
        await MeasuredChanged.InvokeAsync(null);
    }

    private static string Summary(MeasuredSet m)
    {
        var r = m.Response;
        string what = m.Quantity == MeasuredQuantity.LoopGain ? "loop gain" : "plant";
        string ignored = r.IgnoredColumns.Count == 0 ? "" : "; ignored columns: " + string.Join(", ", r.IgnoredColumns);
        return string.Create(Inv, $"{m.FileName}: {r.Count} samples of the {what}, {EngineeringFormat.Format(r.StartHz, "Hz")} to {EngineeringFormat.Format(r.StopHz, "Hz")} (file in {r.FrequencyUnit}){(r.PhaseWasWrapped ? "; wrapped phase unwrapped" : "")}{ignored}.");
    }

    private static string Note(MeasurementComparison c)
    {
        string source = c.Quantity == MeasuredQuantity.LoopGain
            ? "Measured margins come from the measured loop gain itself"
            : "Measured margins come from the measured plant times the design's compensator";
        string turn = c.PhaseAlignmentDeg == 0 ? "" : string.Create(Inv, $" The measured phase was moved by {c.PhaseAlignmentDeg:F0}° (whole turns) to start beside the model's.");
        return string.Create(Inv, $"{source}, by interpolation between samples, over {EngineeringFormat.Format(c.MeasuredMargins.StartHz, "Hz")} to {EngineeringFormat.Format(c.MeasuredMargins.StopHz, "Hz")}. Largest difference to the model: {c.Difference.MaxAbsGainDb:F2} dB, {c.Difference.MaxAbsPhaseDeg:F1}°.{turn}");
    }

    private static string Hz(double? v) => v is double x ? EngineeringFormat.Format(x, "Hz") : "none in range";

    private static string Deg(double? v) => v is double x ? x.ToString("F1", Inv) + "°" : "none in range";

    private static string Db(double? v) => v is double x ? x.ToString("F1", Inv) + " dB" : "none in range";
}
