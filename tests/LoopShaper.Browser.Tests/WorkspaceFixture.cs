using LoopShaper.Tests.Shared;

namespace LoopShaper.Browser.Tests;

/// <summary>One app process for all browser tests of a run.</summary>
public sealed class WorkspaceFixture : IAsyncLifetime
{
    /// <summary>The running app.</summary>
    public WebAppProcess App { get; private set; } = default!;

    /// <inheritdoc />
    public async Task InitializeAsync() => App = await WebAppProcess.StartAsync();

    /// <inheritdoc />
    public async Task DisposeAsync() => await App.DisposeAsync();
}

/// <summary>Browser tests share one app process.</summary>
[CollectionDefinition(Name)]
public sealed class WorkspaceGroup : ICollectionFixture<WorkspaceFixture>
{
    /// <summary>Collection name.</summary>
    public const string Name = "workspace";
}
