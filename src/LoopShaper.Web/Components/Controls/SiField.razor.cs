using LoopShaper.Core.Validation;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>
/// A numeric input that takes SI prefixes and the unit symbol, keeps exactly what was typed, and shows beside it
/// why the text cannot be read or what the core's validation says about the value.
/// </summary>
public partial class SiField : IHandleEvent
{
    /// <summary>The field.</summary>
    [Parameter, EditorRequired]
    public FieldState Field { get; set; } = default!;

    /// <summary>The core's findings of the latest analysis.</summary>
    [Parameter]
    public FieldIssues Issues { get; set; } = FieldIssues.None;

    /// <summary>False hides the label visually (it stays for screen readers), when a heading beside the field names it.</summary>
    [Parameter]
    public bool ShowLabel { get; set; } = true;

    /// <summary>Label text instead of the field's own.</summary>
    [Parameter]
    public string? LabelText { get; set; }

    /// <summary>Raised after the text changed.</summary>
    [Parameter]
    public EventCallback<FieldState> OnChanged { get; set; }

    /// <summary>Element id of the input, derived from the JSON path.</summary>
    public string InputId => IdOf(Field.Path);

    private string MessageId => InputId + "-msg";

    private bool HasError => Messages.Any(m => m.IsError);

    private bool HasWarning => Messages.Count > 0 && !HasError;

    private List<(string Text, bool IsError)> Messages
    {
        get
        {
            var list = new List<(string, bool)>();
            if (Field.ParseError is string parse)
            {
                list.Add((parse, true));
            }
            else
            {
                list.AddRange(Issues.For(Field.Path).Select(i => (i.Message, i.Severity == Severity.Error)));
            }

            return list;
        }
    }

    /// <summary>The element id for a JSON path: "plant.powerStage.inductor.inductanceH" gives "f-plant-powerStage-inductor-inductanceH".</summary>
    public static string IdOf(string path) => "f-" + new string([.. path.Select(c => char.IsLetterOrDigit(c) ? c : '-')]).TrimEnd('-');

    /// <summary>Edits render with the page (<see cref="RelayedEdit"/>).</summary>
    Task IHandleEvent.HandleEventAsync(EventCallbackWorkItem callback, object? arg)
        => RelayedEdit.Handle(callback, arg, OnChanged.HasDelegate, StateHasChanged);

    private async Task OnInput(ChangeEventArgs e)
    {
        Field.SetText(e.Value?.ToString());
        await OnChanged.InvokeAsync(Field);
    }
}
