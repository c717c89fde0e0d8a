using System.Text.Json.Nodes;
using LoopShaper.Core.Design;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli.Tests;

/// <summary>A valid design file with one edit applied, read back: how the design-file tests provoke each finding.</summary>
public static class DesignFileEdits
{
    /// <summary>Reads <paramref name="json"/> after <paramref name="change"/>.</summary>
    public static DesignFileResult Read(string json, Action<JsonNode> change)
    {
        var j = JsonNode.Parse(json)!;
        change(j);
        return DesignFile.Read(j.ToJsonString());
    }

    /// <summary>The errors of <paramref name="json"/> after <paramref name="change"/>; asserts that nothing was loaded.</summary>
    public static List<ValidationIssue> Errors(string json, Action<JsonNode> change)
    {
        var read = Read(json, change);
        Assert.Null(read.Design);
        return [.. read.Errors];
    }

    /// <summary>The one finding at <paramref name="path"/>.</summary>
    public static ValidationIssue OnlyAt(List<ValidationIssue> errors, string path)
        => Assert.Single(errors, i => i.Field == path);
}
