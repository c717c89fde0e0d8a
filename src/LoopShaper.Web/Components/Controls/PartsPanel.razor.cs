using System.Globalization;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;
using Microsoft.AspNetCore.Components;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// The parts of the compensator (op-amp network or OTA network): series choice, R1 (gm and the divider anchor an OTA network)
/// and the neighbour search, every part with its ideal, snapped and chosen value, the loop with ideal, snapped and searched parts side by side, and the parts list and netlists to download. All figures come from the core.
/// </summary>
public partial class PartsPanel
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    /// <summary>The parts of the open design.</summary>
    [Parameter, EditorRequired]
    public PartsWorkspace Parts { get; set; } = default!;

    private DesignForm Form => Workspace.Form;

    private bool Searched => Parts.Report?.Searched is not null;

    /// <summary>A transconductance (OTA) compensator: gm and the divider anchor the parts, R1 does not apply.</summary>
    private bool IsOta => Form.Mode == CompensatorMode.Transconductance;

    private bool Stale => Parts.IsRunning || Parts.DesignRevision != Workspace.Revision;

    private IEnumerable<LoopPerformanceReport> Columns
        => Parts.Report is not { } r ? [] : r.Searched is { } s ? [r.Ideal, r.Snapped, s] : [r.Ideal, r.Snapped];

    /// <summary>A data URI that downloads <paramref name="text"/> as a UTF-8 file.</summary>
    public static string DataUri(string mediaType, string text) => $"data:{mediaType};charset=utf-8,{Uri.EscapeDataString(text)}";

    private static string Value(double? v, string unit, int digits) => v is double x ? Format(x, unit, digits) : "n/a";

    private static string Percent(double? v) => v is double x ? x.ToString("+0.00;-0.00;0.00", Inv) + " %" : "n/a";

    private static string Tolerance(double? v) => v is double x ? "±" + x.ToString("G3", Inv) + " %" : "n/a";

    private static string? ErrorClass(double? v) => v is double x && Math.Abs(x) > 5 ? "large" : null;

    private static string Crossover(LoopPerformanceReport c) => c.CrossoverHz is double f ? Format(f, "Hz") : "none in range";

    private static string PhaseMargin(LoopPerformanceReport c) => c.PhaseMarginDeg is double pm ? pm.ToString("F1", Inv) + " °" : "—";

    private static string GainMargin(LoopPerformanceReport c) => c.GainMarginDb is double gm ? gm.ToString("F1", Inv) + " dB" : "no limit";

    private Task Choose() => Parts.ChooseAsync();

    private Task OnResistorSeries(ChangeEventArgs e) => Apply(() =>
    {
        if (Enum.TryParse<ESeries>(e.Value?.ToString(), out var s))
        {
            Form.ResistorSeries = s;
        }
    });

    private Task OnCapacitorSeries(ChangeEventArgs e) => Apply(() =>
    {
        if (Enum.TryParse<ESeries>(e.Value?.ToString(), out var s))
        {
            Form.CapacitorSeries = s;
        }
    });

    private Task OnSearch(ChangeEventArgs e) => Apply(() => Form.SearchNeighbours = e.Value is bool b && b);

    private Task OnR1(FieldState _) => Apply(() => { });

    /// <summary>A parts setting is part of the design: analyse it (validation beside the field), then choose parts with it.</summary>
    private async Task Apply(Action change)
    {
        change();
        await Workspace.RecomputeAsync();
        if (!Parts.IsActive)
        {
            await Parts.ChooseAsync();
        }
    }
}
