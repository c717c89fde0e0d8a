using LoopShaper.Web;
using LoopShaper.Web.Components;

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
app.Map("/error", () => Results.Problem("The workspace hit an unexpected error; the server log has the details."));
app.MapRazorComponents<App>().AddInteractiveServerRenderMode();

app.Run();

/// <summary>Entry point, visible to in-process test hosts.</summary>
public partial class Program;
