using LoopShaper.Library;
using LoopShaper.Web;
using LoopShaper.Web.Components;

var builder = WebApplication.CreateBuilder(args);

// Loopback only unless the operator passes --urls: the workspace has no authentication.
builder.WebHost.UseUrls(builder.Configuration["urls"] ?? builder.Configuration["Urls"] ?? DesignerDefaults.Url);

builder.Services.AddRazorComponents().AddInteractiveServerComponents();
builder.Services.AddSingleton<DemoDesign>();

// The design library: --library PATH, else Library:Path, else the user's data folder (docs/library.md).
string libraryPath = LibraryLocation.Resolve(builder.Configuration[LibraryLocation.CommandLineKey], builder.Configuration[LibraryLocation.ConfigurationKey]);
builder.Services.AddSingleton(sp => new LibraryHost(libraryPath, sp.GetRequiredService<ILogger<LibraryHost>>()));
builder.Services.AddScoped<LibrarySession>();

var app = builder.Build();

if (!app.Environment.IsDevelopment())
{
    app.UseExceptionHandler("/error", createScopeForErrors: true);
}

app.UseAntiforgery();
app.MapStaticAssets();
app.MapDesignFileEndpoints();
if (app.Configuration.GetValue<bool>(LibraryAutomationEndpoints.SwitchKey))
{
    app.MapLibraryAutomationEndpoints();
}

app.Map("/error", () => Results.Problem("The workspace hit an unexpected error; the server log has the details."));
app.MapRazorComponents<App>().AddInteractiveServerRenderMode();

app.Run();

/// <summary>Entry point, visible to in-process test hosts.</summary>
public partial class Program;
