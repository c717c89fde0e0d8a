namespace LoopShaper.Core.Design;

/// <summary>
/// The LoopShaper design file: a versioned JSON format of our own (docs/design-file.md). Field names are the paths
/// <see cref="Validation.DesignValidator"/> reports. Numbers are written in SI base units; when reading, text with an SI
/// prefix and the field's unit ("2.2 uH", "500kHz", "10k") is accepted too.
/// </summary>
public static class DesignFile
{
    /// <summary>The value of the top-level "format" field.</summary>
    public const string FormatName = "loopshaper-design";

    /// <summary>The version this program writes. Version 2 added peak current mode, the modulator delay as a fraction of
    /// the period, real error amplifiers (op-amp and transconductance), analysis.conductionModel and the synthesis section.</summary>
    public const int CurrentVersion = 2;

    /// <summary>The oldest version this program still reads (version 1 files read unchanged).</summary>
    public const int OldestVersion = 1;

    /// <summary>
    /// Reads a design file. Never throws for bad input: syntax errors (with line and column), wrong types, units and
    /// words, missing and unknown fields all come back in <see cref="DesignFileResult.Errors"/> with their JSON path,
    /// and the design is null then. Ranges are not checked here: run <see cref="Validation.DesignValidator"/> (or
    /// <see cref="DesignAnalyzer.Analyze"/>) on the design.
    /// </summary>
    public static DesignFileResult Read(string json) => DesignFileReader.Read(json);

    /// <summary>
    /// Writes a design as indented, culture-invariant JSON in SI base units; <c>Read(Write(d))</c> gives back every
    /// value of <paramref name="design"/> exactly (numbers are written in their shortest round-trip form).
    /// </summary>
    /// <exception cref="ArgumentException">A number of the design is NaN or infinite: JSON cannot hold it.</exception>
    public static string Write(LoopDesign design) => DesignFileWriter.Write(design);
}
