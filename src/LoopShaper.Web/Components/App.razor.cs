using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Web;

namespace LoopShaper.Web.Components;

/// <summary>The HTML document: interactive server rendering without prerendering (the charts need the circuit).</summary>
public partial class App
{
    /// <summary>Interactive server, not prerendered.</summary>
    internal static readonly IComponentRenderMode Interactive = new InteractiveServerRenderMode(prerender: false);
}
