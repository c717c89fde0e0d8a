namespace LoopShaper.Core.Reporting.Html;

/// <summary>The paper a printed report is laid out for (CSS @page size).</summary>
public enum PaperSize
{
    /// <summary>ISO 216 A4, 210 x 297 mm.</summary>
    A4,

    /// <summary>US Letter, 8.5 x 11 in.</summary>
    Letter,
}
