using System.Buffers.Text;
using System.IO.Compression;
using System.Text;
using LoopShaper.Core.Design;

namespace LoopShaper.Web.Model;

/// <summary>
/// A design packed into a URL: the design file (<see cref="DesignFile.Write"/>) compressed with Brotli and written
/// in base64url (RFC 4648, sec. 5), so that a link reopens exactly the same design on another machine.
/// </summary>
public static class ShareToken
{
    /// <summary>Name of the query parameter that carries the token.</summary>
    public const string QueryName = "d";

    /// <summary>Largest design file a token may unpack to, bytes.</summary>
    public const int MaxJsonBytes = 1024 * 1024;

    /// <summary>The token of a design file's text.</summary>
    public static string FromJson(string json)
    {
        using var packed = new MemoryStream();
        using (var brotli = new BrotliStream(packed, CompressionLevel.SmallestSize, leaveOpen: true))
        {
            brotli.Write(Encoding.UTF8.GetBytes(json));
        }

        return Base64Url.EncodeToString(packed.ToArray());
    }

    /// <summary>The token of a design.</summary>
    /// <exception cref="ArgumentException">The design holds a number JSON cannot represent (NaN or infinity).</exception>
    public static string FromDesign(LoopDesign design) => FromJson(DesignFile.Write(design));

    /// <summary>Unpacks a token to the design file's text; false with a message for anything that is not a token of ours.</summary>
    public static bool TryReadJson(string? token, out string json, out string error)
    {
        json = string.Empty;
        error = string.Empty;
        if (string.IsNullOrWhiteSpace(token))
        {
            error = "the link carries no design.";
            return false;
        }

        byte[] packed;
        try
        {
            packed = Base64Url.DecodeFromChars(token.Trim());
        }
        catch (FormatException)
        {
            error = "the link's design part is damaged (not base64url); copy the whole link again.";
            return false;
        }

        try
        {
            using var input = new BrotliStream(new MemoryStream(packed), CompressionMode.Decompress);
            using var output = new MemoryStream();
            var buffer = new byte[16384];
            int n;
            while ((n = input.Read(buffer)) > 0)
            {
                output.Write(buffer, 0, n);
                if (output.Length > MaxJsonBytes)
                {
                    error = $"the link's design is larger than {MaxJsonBytes / 1024} KiB.";
                    return false;
                }
            }

            if (output.Length == 0)
            {
                error = "the link's design part is damaged (it unpacks to nothing); copy the whole link again.";
                return false;
            }

            json = Encoding.UTF8.GetString(output.ToArray());
            return true;
        }
        catch (InvalidDataException)
        {
            error = "the link's design part is damaged (cannot be unpacked); copy the whole link again.";
            return false;
        }
    }

    /// <summary>A file name for a design: its name in lower case with dashes, ".json" appended.</summary>
    public static string FileNameOf(string designName)
    {
        var slug = new string([.. designName.ToLowerInvariant().Select(c => char.IsAsciiLetterOrDigit(c) ? c : '-')]);
        while (slug.Contains("--", StringComparison.Ordinal))
        {
            slug = slug.Replace("--", "-", StringComparison.Ordinal);
        }

        slug = slug.Trim('-');
        return (slug.Length == 0 ? "design" : slug) + ".json";
    }
}
