namespace LoopShaper.Web.Model;

/// <summary>An <see cref="IProgress{T}"/> that calls its action on the reporting thread (unlike <see cref="Progress{T}"/>, which posts to a context).</summary>
/// <typeparam name="T">What is reported.</typeparam>
/// <param name="report">Called with every report.</param>
public sealed class RelayProgress<T>(Action<T> report) : IProgress<T>
{
    /// <inheritdoc />
    public void Report(T value) => report(value);
}
