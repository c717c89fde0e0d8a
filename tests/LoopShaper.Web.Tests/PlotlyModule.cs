namespace LoopShaper.Web.Tests;

/// <summary>The Plotly.Blazor 7.2.0 JavaScript module, set up in bUnit's strict JS interop so that every call is recorded and checked.</summary>
public static class PlotlyModule
{
    /// <summary>Path Plotly.Blazor imports its interop module from.</summary>
    public const string ModulePath = "./_content/Plotly.Blazor/plotly-interop-7.2.0.js";

    /// <summary>The plotly.js bundle it loads.</summary>
    public const string ScriptPath = "./_content/Plotly.Blazor/plotly-basic-3.7.0.min.js";

    /// <summary>Sets up the module and the calls the workspace's charts make; anything else fails the test.</summary>
    public static BunitJSModuleInterop Setup(BunitJSInterop js)
    {
        var module = js.SetupModule(ModulePath);
        module.SetupVoid("importScript", "plotly-import", ScriptPath).SetVoidResult();
        module.SetupVoid("newPlot", _ => true).SetVoidResult();
        module.SetupVoid("react", _ => true).SetVoidResult();
        module.SetupVoid("subscribeClickEvent", _ => true).SetVoidResult();
        module.SetupVoid("purge", _ => true).SetVoidResult();
        var visibility = js.SetupModule(LoopShaper.Web.Components.Controls.LiveChart.VisibilityModule);
        visibility.SetupVoid("watch", _ => true).SetVoidResult();
        visibility.SetupVoid("unwatch", _ => true).SetVoidResult();
        var redraws = js.SetupModule(LoopShaper.Web.Components.Controls.ChartRedrawGroup.ModulePath);
        redraws.SetupVoid("reactAll", _ => true).SetVoidResult();
        return module;
    }

    /// <summary>
    /// The calls recorded so far, copied: bUnit's record is not safe to read while the renderer's thread adds to it
    /// (a chart's Plotly.react comes after its render), so a copy that raced with a new call is taken again.
    /// </summary>
    public static List<JSRuntimeInvocation> Calls(BunitJSModuleInterop module)
    {
        while (true)
        {
            try
            {
                return [.. module.Invocations];
            }
            catch (InvalidOperationException)
            {
                Thread.Yield();
            }
        }
    }
}
