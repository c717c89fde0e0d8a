namespace LoopShaper.Web.Model;

/// <summary>Fixed settings of the workspace.</summary>
public static class DesignerDefaults
{
    /// <summary>Where the app listens when no --urls is given: loopback only.</summary>
    public const string Url = "http://127.0.0.1:5180";

    /// <summary>Largest design file accepted by the upload, bytes.</summary>
    public const long MaxUploadBytes = 1024 * 1024;
}
