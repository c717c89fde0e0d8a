using Microsoft.Extensions.DependencyInjection;

namespace LoopShaper.Web.Tests;

/// <summary>The Plotly.Blazor 7.2.0 JavaScript module, set up in bUnit's strict JS interop so that every call is recorded and checked.</summary>
public static class PlotlyModule
{
    /// <summary>Path Plotly.Blazor imports its interop module from.</summary>
    public const string ModulePath = "./_content/Plotly.Blazor/plotly-interop-7.2.0.js";

    /// <summary>The plotly.js bundle it loads.</summary>
    public const string ScriptPath = "./_content/Plotly.Blazor/plotly-basic-3.7.0.min.js";

    /// <summary>
    /// Sets up the module and the calls the workspace's charts make (anything else fails the test), with the test's JS
    /// runtime taking one call at a time (<see cref="SerializedJsRuntime"/>).
    /// </summary>
    public static BunitJSModuleInterop Setup(BunitContext context)
    {
        Serialize(context);
        return Setup(context.JSInterop);
    }

    /// <summary>Components of <paramref name="context"/> get a JS runtime that takes one call at a time.</summary>
    public static SerializedJsRuntime Serialize(BunitContext context)
    {
        var runtime = new SerializedJsRuntime(context.JSInterop.JSRuntime);
        context.Services.AddSingleton<Microsoft.JSInterop.IJSRuntime>(runtime);
        return runtime;
    }

    /// <summary>Sets up the module and the calls the workspace's charts make; anything else fails the test.</summary>
    private static BunitJSModuleInterop Setup(BunitJSInterop js)
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
    /// The calls recorded so far, copied under <see cref="SerializedJsRuntime.Gate"/>: bUnit's record is not safe to
    /// read while a call is added to it (a chart's Plotly.react comes from the thread pool).
    /// </summary>
    public static List<JSRuntimeInvocation> Calls(BunitJSModuleInterop module)
    {
        lock (SerializedJsRuntime.Gate)
        {
            return [.. module.Invocations];
        }
    }

    /// <summary>Every JS call recorded so far, copied under the same gate.</summary>
    public static List<JSRuntimeInvocation> Calls(BunitJSInterop js)
    {
        lock (SerializedJsRuntime.Gate)
        {
            return [.. js.Invocations];
        }
    }
}
