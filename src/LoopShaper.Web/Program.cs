using LoopShaper.Web.Components;
using LoopShaper.Web;

var builder = WebApplication.CreateBuilder(args);

// Loopback only unless the operator passes --urls: the workspace has no authentication.
builder.WebHost.UseUrls(builder.Configuration["urls"] ?? builder.Configuration["Urls"] ?? DesignerDefaults.Url);

builder.Services.AddRazorComponents().AddInteractiveServerComponents();
builder.Services.AddSingleton<DemoDesign>();

var app = builder.Build();

if (!app.Environment.IsDevelopment())
{
    app.UseExceptionHandler("/error", createScopeForErrors: true);
}

app.UseAntiforgery();
app.MapStaticAssets();
app.MapDesignFileEndpoints();
app.MapRazorComponents<App>().AddInteractiveServerRenderMode();

app.Run();

/// <summary>Entry point, visible to in-process test hosts.</summary>
public partial class Program;
