using LoopShaper.Core.Measurements;

namespace LoopShaper.Web.Model;

/// <summary>A measured response imported into the workspace, what it measures and the file it came from.</summary>
/// <param name="Response">The samples as the core read them.</param>
/// <param name="Quantity">Loop gain or plant.</param>
/// <param name="FileName">The uploaded file's name.</param>
public sealed record MeasuredSet(MeasuredResponse Response, MeasuredQuantity Quantity, string FileName);
