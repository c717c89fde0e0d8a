using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>One compensator pole, zero or gain setting: a slider (logarithmic for frequencies) and the typed value.</summary>
public partial class PlacementControl : IHandleEvent
{
    /// <summary>Edits render with the page (<see cref="RelayedEdit"/>).</summary>
    Task IHandleEvent.HandleEventAsync(EventCallbackWorkItem callback, object? arg)
        => RelayedEdit.Handle(callback, arg, OnChanged.HasDelegate, StateHasChanged);

    /// <summary>The form.</summary>
    [Parameter, EditorRequired]
    public DesignForm Form { get; set; } = default!;

    /// <summary>Which quantity this control moves.</summary>
    [Parameter, EditorRequired]
    public PlacementTarget Target { get; set; }

    /// <summary>The quantity selected for nudging on the chart.</summary>
    [Parameter]
    public PlacementTarget? Selected { get; set; }

    /// <summary>The core's findings.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>Raised after the value changed.</summary>
    [Parameter]
    public EventCallback OnChanged { get; set; }

    /// <summary>Raised when the engineer selects this quantity.</summary>
    [Parameter]
    public EventCallback<PlacementTarget> OnSelect { get; set; }

    private FieldState Field => Placement.FieldOf(Form, Target);

    private bool IsSelected => Selected == Target;

    private string Name => Placement.NameOf(Form, Target);

    private bool Logarithmic => Placement.IsFrequency(Form, Target);

    private (double Min, double Max) Range => Logarithmic ? Placement.FrequencyRange(Form) : Placement.GainRangeDb;

    private int SliderPosition => Placement.ToSlider(Field.Value ?? double.NaN, Range, Logarithmic);

    private string GlyphClass => Target switch
    {
        PlacementTarget.Gain => "glyph-gain",
        PlacementTarget.Zero1 or PlacementTarget.Zero2 => "glyph-zero",
        _ => "glyph-pole",
    };

    private Task Select() => OnSelect.InvokeAsync(Target);

    private async Task OnSlide(ChangeEventArgs e)
    {
        if (int.TryParse(e.Value?.ToString(), System.Globalization.NumberStyles.Integer, System.Globalization.CultureInfo.InvariantCulture, out int position))
        {
            Field.SetValue(Placement.FromSlider(position, Range, Logarithmic));
            await OnChanged.InvokeAsync();
        }
    }

    private Task OnTyped(FieldState _) => OnChanged.InvokeAsync();
}
