using Microsoft.Extensions.Logging;

namespace LoopShaper.Web.Tests;

/// <summary>A logger provider that keeps every entry, to check what the server log records.</summary>
public sealed class RecordingLoggerProvider : ILoggerProvider
{
    /// <summary>Entries as "Level Category: message".</summary>
    public List<(LogLevel Level, string Category, string Message, Exception? Exception)> Entries { get; } = [];

    /// <inheritdoc />
    public ILogger CreateLogger(string categoryName) => new Recorder(this, categoryName);

    /// <inheritdoc />
    public void Dispose()
    {
    }

    private sealed class Recorder(RecordingLoggerProvider owner, string category) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state)
            where TState : notnull => null;

        public bool IsEnabled(LogLevel logLevel) => true;

        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            lock (owner.Entries)
            {
                owner.Entries.Add((logLevel, category, formatter(state, exception), exception));
            }
        }
    }
}
