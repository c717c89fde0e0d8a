using Microsoft.JSInterop;

namespace LoopShaper.Web.Tests;

/// <summary>
/// bUnit's JS interop with its calls taken one at a time. bUnit records every call in a plain dictionary of lists, and
/// the charts call JavaScript from the thread pool (their redraws) while the renderer calls it too (first plots,
/// visibility watches): two calls at once can corrupt the record or throw from it. Every call, and every read of the
/// record through PlotlyModule.Calls, takes <see cref="Gate"/>.
/// </summary>
public sealed class SerializedJsRuntime(IJSRuntime inner) : IJSRuntime
{
    /// <summary>Held while bUnit records a call and while a test copies the record.</summary>
    public static readonly object Gate = new();

    /// <inheritdoc />
    public ValueTask<TValue> InvokeAsync<TValue>(string identifier, object?[]? args)
    {
        ValueTask<TValue> call;
        lock (Gate)
        {
            call = inner.InvokeAsync<TValue>(identifier, args);
        }

        return Wrapped(call);
    }

    /// <inheritdoc />
    public ValueTask<TValue> InvokeAsync<TValue>(string identifier, CancellationToken cancellationToken, object?[]? args)
    {
        ValueTask<TValue> call;
        lock (Gate)
        {
            call = inner.InvokeAsync<TValue>(identifier, cancellationToken, args);
        }

        return Wrapped(call);
    }

    // A module imported through this runtime is called through it too.
    private static async ValueTask<TValue> Wrapped<TValue>(ValueTask<TValue> call)
    {
        var value = await call.ConfigureAwait(false);
        return value is IJSObjectReference module and not Module ? (TValue)(object)new Module(module) : value;
    }

    private sealed class Module(IJSObjectReference inner) : IJSObjectReference
    {
        public ValueTask<TValue> InvokeAsync<TValue>(string identifier, object?[]? args)
        {
            lock (Gate)
            {
                return inner.InvokeAsync<TValue>(identifier, args);
            }
        }

        public ValueTask<TValue> InvokeAsync<TValue>(string identifier, CancellationToken cancellationToken, object?[]? args)
        {
            lock (Gate)
            {
                return inner.InvokeAsync<TValue>(identifier, cancellationToken, args);
            }
        }

        public ValueTask DisposeAsync() => inner.DisposeAsync();
    }
}
