namespace LoopShaper.Web;

/// <summary>The body of a 400 or 413 answer of the API.</summary>
/// <param name="Title">What went wrong, in one sentence.</param>
/// <param name="Errors">Each error with its JSON path.</param>
public sealed record ApiErrors(string Title, IReadOnlyList<ApiError> Errors);
