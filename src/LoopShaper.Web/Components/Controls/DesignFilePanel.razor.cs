using LoopShaper.Core.Design;
using LoopShaper.Core.Validation;
using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Forms;

namespace LoopShaper.Web.Components.Controls;

/// <summary>Open a design file, download the current design, and make a link that reopens it elsewhere.</summary>
public partial class DesignFilePanel
{
    private bool _saveOpen;
    private string? _saveError;
    private string? _saveNote;
    private string _token = string.Empty;
    private string _link = string.Empty;
    private string _fileName = "design.json";
    private List<ValidationIssue> _openErrors = [];
    private string? _openMessage;
    private string _openedName = string.Empty;

    /// <summary>The open design.</summary>
    [Parameter, EditorRequired]
    public DesignWorkspace Workspace { get; set; } = default!;

    /// <summary>The demo design.</summary>
    [Parameter, EditorRequired]
    public LoopDesign Demo { get; set; } = default!;

    [Inject]
    private NavigationManager Navigation { get; set; } = default!;

    private string DownloadHref => DesignFileEndpoints.DownloadPath.TrimStart('/') + "?" + ShareToken.QueryName + "=" + _token;

    /// <summary>Reads a design file's text and, only when it has no error at all, replaces the open design.</summary>
    public async Task OpenTextAsync(string name, string json)
    {
        _openedName = name;
        _openMessage = null;
        var read = DesignFile.Read(json);
        if (read.Design is null)
        {
            _openErrors = [.. read.Errors];
            StateHasChanged();
            return;
        }

        _openErrors = [];
        _saveOpen = false;
        StateHasChanged();
        await Workspace.LoadAsync(read.Design);
    }

    private async Task OnFileChosen(InputFileChangeEventArgs e)
    {
        _openErrors = [];
        _openMessage = null;
        var file = e.File;
        if (file.Size > DesignerDefaults.MaxUploadBytes)
        {
            _openMessage = $"'{file.Name}' is {file.Size / 1024} KiB; a design file is at most {DesignerDefaults.MaxUploadBytes / 1024} KiB. Nothing was changed.";
            return;
        }

        string json;
        try
        {
            using var reader = new StreamReader(file.OpenReadStream(DesignerDefaults.MaxUploadBytes));
            json = await reader.ReadToEndAsync();
        }
        catch (IOException ex)
        {
            _openMessage = $"'{file.Name}' could not be read: {ex.Message} Nothing was changed.";
            return;
        }

        await OpenTextAsync(file.Name, json);
    }

    private void ToggleSave()
    {
        _saveOpen = !_saveOpen;
        if (!_saveOpen)
        {
            return;
        }

        var design = Workspace.Form.Build();
        try
        {
            _token = ShareToken.FromDesign(design);
            _fileName = ShareToken.FileNameOf(design.Name);
            _link = Navigation.BaseUri + "?" + ShareToken.QueryName + "=" + _token;
            _saveError = null;
            int unreadable = Workspace.Form.UnreadableFields.Count();
            _saveNote = unreadable > 0 ? $"{unreadable} field(s) cannot be read; their last readable values are saved." : null;
        }
        catch (ArgumentException ex)
        {
            _saveError = "This design cannot be saved yet: " + ex.Message + " Fill in every required field first.";
        }
    }

    private void DismissErrors()
    {
        _openErrors = [];
        _openMessage = null;
    }

    private Task OnDemo()
    {
        _saveOpen = false;
        DismissErrors();
        return Workspace.LoadAsync(Demo);
    }
}
