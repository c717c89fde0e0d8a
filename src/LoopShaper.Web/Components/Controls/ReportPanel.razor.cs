using LoopShaper.Core.Design;
using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Controls;

/// <summary>The report download: a link to GET /report with the analysed design packed in a share token.</summary>
public sealed partial class ReportPanel
{
    private string _paper = "A4";
    private LoopDesign? _tokenOf;
    private string? _token;

    /// <summary>The design of the latest valid analysis, or null.</summary>
    [Parameter]
    public LoopDesign? Design { get; set; }

    /// <summary>The download address, relative to the base URI; null without a design.</summary>
    public string? Href => _token is null ? null : ReportEndpoints.ReportPath.TrimStart('/') + "?" + ShareToken.QueryName + "=" + _token + "&paper=" + _paper;

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (!ReferenceEquals(Design, _tokenOf))
        {
            _tokenOf = Design;
            _token = Design is null ? null : ShareToken.FromDesign(Design);
        }
    }

    private void OnPaper(ChangeEventArgs e) => _paper = e.Value?.ToString() == "Letter" ? "Letter" : "A4";
}
