using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The compensator inputs: by pole and zero frequencies (each with a slider) or by the op-amp network's parts.</summary>
public partial class CompensatorEditor : IHandleEvent
{
    /// <summary>Edits render with the page (<see cref="RelayedEdit"/>).</summary>
    Task IHandleEvent.HandleEventAsync(EventCallbackWorkItem callback, object? arg)
        => RelayedEdit.Handle(callback, arg, OnChanged.HasDelegate, StateHasChanged);

    /// <summary>The form.</summary>
    [Parameter, EditorRequired]
    public DesignForm Form { get; set; } = default!;

    /// <summary>The latest analysis (for switching modes without moving the loop).</summary>
    [Parameter]
    public DesignAnalysis? Analysis { get; set; }

    /// <summary>The quantity selected for nudging on the chart.</summary>
    [Parameter]
    public PlacementTarget? Selected { get; set; }

    /// <summary>The core's findings.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>Raised after any change.</summary>
    [Parameter]
    public EventCallback OnChanged { get; set; }

    /// <summary>Raised when the engineer selects a quantity.</summary>
    [Parameter]
    public EventCallback<PlacementTarget> OnSelect { get; set; }

    private IEnumerable<PlacementTarget> FrequencyTargets => Form.CompensatorType switch
    {
        CompensatorType.TypeI => [],
        CompensatorType.TypeII => [PlacementTarget.Zero1, PlacementTarget.Pole1],
        _ => [PlacementTarget.Zero1, PlacementTarget.Zero2, PlacementTarget.Pole1, PlacementTarget.Pole2],
    };

    private Task Changed(FieldState _) => OnChanged.InvokeAsync();

    private Task OnMode(ChangeEventArgs e)
    {
        if (Enum.TryParse<CompensatorMode>(e.Value?.ToString(), out var mode))
        {
            Form.Mode = mode;
            if (mode == CompensatorMode.Transconductance && Form.CompensatorType == CompensatorType.TypeIII)
            {
                Form.CompensatorType = CompensatorType.TypeII;
            }
        }

        return OnChanged.InvokeAsync();
    }

    private Task OnType(ChangeEventArgs e)
    {
        if (Enum.TryParse<CompensatorType>(e.Value?.ToString(), out var type))
        {
            Form.CompensatorType = type;
            if (type == CompensatorType.TypeI && Form.GainKind == GainSettingKind.MidbandGainDb)
            {
                Form.SetGainKind(GainSettingKind.CrossoverHz, Analysis?.Margins?.CrossoverHz);
            }
        }

        return OnChanged.InvokeAsync();
    }

    private Task OnGainKind(ChangeEventArgs e)
    {
        if (Enum.TryParse<GainSettingKind>(e.Value?.ToString(), out var kind) && kind != Form.GainKind)
        {
            // Start from where the loop is now, as the core resolved it.
            double? start = kind switch
            {
                GainSettingKind.IntegratorHz => Analysis?.ResolvedPlacement?.Gain.Value,
                GainSettingKind.CrossoverHz => Analysis?.Margins?.CrossoverHz,
                _ => Form.Zero1.Value is double z1 && Analysis?.Loop is not null ? Analysis.Loop.Compensator.MagnitudeDb(z1) : null,
            };
            Form.SetGainKind(kind, start);
        }

        return OnChanged.InvokeAsync();
    }

    private Task OnAmplifier(ChangeEventArgs e)
    {
        Form.RealOpAmp = bool.TryParse(e.Value?.ToString(), out var real) && real;
        return OnChanged.InvokeAsync();
    }

    private Task UseResolvedPlacement()
    {
        if (Analysis?.ResolvedPlacement is CompensatorPlacement p)
        {
            Form.UsePlacement(p);
        }

        return OnChanged.InvokeAsync();
    }
}
