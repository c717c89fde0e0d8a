namespace LoopShaper.Core.Reporting.Html;

/// <summary>How an HTML report is made.</summary>
/// <param name="Paper">The paper its print style lays it out for.</param>
/// <param name="GeneratedUtc">The date and time printed on it (UTC).</param>
/// <param name="Version">The LoopShaper version printed on it; null for the core's own assembly version.</param>
public sealed record HtmlReportOptions(PaperSize Paper, DateTimeOffset GeneratedUtc, string? Version = null);
