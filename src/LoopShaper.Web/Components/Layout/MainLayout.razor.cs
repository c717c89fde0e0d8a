using Microsoft.AspNetCore.Components;

namespace LoopShaper.Web.Components.Layout;

/// <summary>The page frame: a top bar with the product name and the workspace below it.</summary>
public partial class MainLayout : LayoutComponentBase
{
}
