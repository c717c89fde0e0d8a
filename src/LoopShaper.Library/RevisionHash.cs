using System.Security.Cryptography;
using System.Text;

namespace LoopShaper.Library;

/// <summary>The content hash stored beside every revision: SHA-256 (FIPS 180-4) of the UTF-8 text, lower-case hex.</summary>
public static class RevisionHash
{
    /// <summary>SHA-256 of <paramref name="content"/>'s UTF-8 bytes as 64 lower-case hex digits.</summary>
    public static string Of(string content) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(content)));
}
