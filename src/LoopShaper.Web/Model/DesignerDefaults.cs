namespace LoopShaper.Web.Model;

/// <summary>Fixed settings of the workspace.</summary>
public static class DesignerDefaults
{
    /// <summary>Where the app listens when no --urls is given: loopback only.</summary>
    public const string Url = "http://127.0.0.1:5180";

    /// <summary>Largest design file accepted by the upload, bytes.</summary>
    public const long MaxUploadBytes = 1024 * 1024;

    /// <summary>
    /// How long a design must stay unchanged before the background panels (corner sweep, closed-loop performance)
    /// analyse it, ms: while the engineer types or drags, both cores go to the loop-gain and step charts.
    /// </summary>
    public const int SettleMs = 300;
}
