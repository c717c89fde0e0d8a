using LoopShaper.Core.Design;
using LoopShaper.Web.Components.Controls;
using Microsoft.AspNetCore.Components;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LoopShaper.Web.Tests;

/// <summary>A failure stays in its panel and reaches the server log.</summary>
public sealed class ErrorHandlingTests : BunitContext
{
    private readonly RecordingLoggerProvider _log = new();

    public ErrorHandlingTests()
    {
        Services.AddLogging(b => b.AddProvider(_log));
    }

    [Fact]
    public void A_panel_that_throws_shows_its_message_and_is_logged()
    {
        var cut = Render<PanelBoundary>(p => p
            .Add(b => b.Panel, "Loop gain chart")
            .Add(b => b.ChildContent, (RenderFragment)(builder =>
            {
                builder.OpenComponent<Throwing>(0);
                builder.CloseComponent();
            })));
        cut.Render();

        var box = cut.Find("[data-panel-error='Loop gain chart']");
        Assert.Contains("Loop gain chart could not be shown.", box.TextContent, StringComparison.Ordinal);
        Assert.Contains(Throwing.Message, box.TextContent, StringComparison.Ordinal);
        Assert.Contains(_log.Entries, e => e.Level == LogLevel.Error && e.Message.Contains("Loop gain chart", StringComparison.Ordinal) && e.Exception?.Message == Throwing.Message);
    }

    [Fact]
    public async Task A_failed_analysis_is_reported_to_the_panels_and_logged()
    {
        var logger = Services.GetRequiredService<ILoggerFactory>().CreateLogger("test");
        var workspace = new DesignWorkspace(TestDesigns.Demo, logger, _ => throw new InvalidOperationException("solver blew up"));
        await workspace.RecomputeAsync();

        Assert.Null(workspace.Analysis);
        Assert.Equal("The analysis failed: solver blew up", workspace.ComputationError);
        Assert.Contains(_log.Entries, e => e.Level == LogLevel.Error && e.Exception?.Message == "solver blew up");

        var summary = Render<SummaryPanel>(p => p.Add(s => s.Analysis, workspace.Analysis).Add(s => s.ComputationError, workspace.ComputationError));
        Assert.Equal("The analysis failed: solver blew up", summary.Find("[data-summary-state]").TextContent);
    }

    [Fact]
    public async Task Changes_during_an_analysis_fold_into_one_more_run_with_the_latest_input()
    {
        var gate = new TaskCompletionSource();
        var seen = new List<double>();
        var logger = Services.GetRequiredService<ILoggerFactory>().CreateLogger("test");
        DesignWorkspace? workspace = null;
        workspace = new DesignWorkspace(TestDesigns.Demo, logger, d =>
        {
            seen.Add(((LoopShaper.Core.PlantModels.BuckPlant)d.Plant).PowerStage.Inductor.InductanceH);
            if (seen.Count == 1)
            {
                gate.Task.Wait();
            }

            return DesignAnalyzer.Analyze(d);
        });

        var first = workspace.RecomputeAsync();
        workspace.Form.Inductance.SetText("1u");
        await workspace.RecomputeAsync();
        workspace.Form.Inductance.SetText("1.5u");
        await workspace.RecomputeAsync();
        gate.SetResult();
        await first;

        Assert.Equal(new[] { ((LoopShaper.Core.PlantModels.BuckPlant)TestDesigns.Demo.Plant).PowerStage.Inductor.InductanceH, 1.5e-6 }, seen);
        Assert.Equal(2, workspace.Revision);
    }

    private sealed class Throwing : ComponentBase
    {
        public const string Message = "payload could not be built";

        protected override void OnInitialized() => throw new InvalidOperationException(Message);
    }
}
