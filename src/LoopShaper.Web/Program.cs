using LoopShaper.Library;
using LoopShaper.Web;
using LoopShaper.Web.Components;

var builder = WebApplication.CreateBuilder(args);

// Loopback only unless the operator passes --urls: the workspace has no authentication.
builder.WebHost.UseUrls(builder.Configuration["urls"] ?? builder.Configuration["Urls"] ?? DesignerDefaults.Url);

builder.Services.AddRazorComponents().AddInteractiveServerComponents();
builder.Services.AddSingleton<DemoDesign>();
// The automation API's OpenAPI document, at /openapi/v1.json (docs/api.md).
builder.Services.AddOpenApi(o => o.AddDocumentTransformer((doc, _, _) =>
{
    doc.Info.Title = "LoopShaper API";
    doc.Info.Description = "Analyse a LoopShaper design file over HTTP: the same JSON as `loopshaper analyze FILE --format json`.";
    return Task.CompletedTask;
}));

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
app.MapReportEndpoints();
app.MapAnalyzeApi();
app.MapOpenApi();
if (app.Configuration.GetValue<bool>(LibraryAutomationEndpoints.SwitchKey))
{
    app.MapLibraryAutomationEndpoints();
}

app.Map("/error", () => Results.Problem("The workspace hit an unexpected error; the server log has the details."));
app.MapRazorComponents<App>().AddInteractiveServerRenderMode();

app.Run();

/// <summary>Entry point, visible to in-process test hosts.</summary>
public partial class Program;
