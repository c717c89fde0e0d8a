using System.Reflection;
using LoopShaper.Core.Design;

namespace LoopShaper.Web.Model;

/// <summary>
/// The design the workspace opens with: docs/examples/core-rail-12v-to-1v0.json (a processor-core rail of our own),
/// embedded in the app so that it opens the same everywhere.
/// </summary>
public sealed class DemoDesign
{
    /// <summary>Name of the embedded resource.</summary>
    public const string ResourceName = "LoopShaper.Web.DemoDesign.json";

    private static readonly Lazy<LoopDesign> Cached = new(Load);

    /// <summary>The demo design.</summary>
    public LoopDesign Design => Cached.Value;

    /// <summary>The demo design.</summary>
    public static LoopDesign Create() => Cached.Value;

    /// <summary>The embedded design file's text.</summary>
    public static string Json()
    {
        using var stream = Assembly.GetExecutingAssembly().GetManifestResourceStream(ResourceName)
            ?? throw new InvalidOperationException($"The demo design resource {ResourceName} is missing from the build.");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }

    private static LoopDesign Load()
    {
        var read = DesignFile.Read(Json());
        return read.Design ?? throw new InvalidOperationException("The embedded demo design does not read: " + string.Join("; ", read.Errors));
    }
}
