using System.Globalization;
using LoopShaper.Core.Units;

namespace LoopShaper.Web.Model;

/// <summary>
/// One numeric input: the raw text exactly as typed, the last value that could be read from it, and why the current
/// text cannot be read (parsed with <see cref="SiValue.TryParse"/>, so SI prefixes and the unit symbol are accepted).
/// The text is never replaced by the program except when the user moves a slider or loads a design.
/// </summary>
public sealed class FieldState
{
    /// <summary>A field initialised from a value (null leaves it empty).</summary>
    public FieldState(string path, string label, string unit, double? value, string? displayUnit = null, bool optional = false, bool wholeNumber = false)
    {
        Path = path;
        Label = label;
        Unit = unit;
        DisplayUnit = displayUnit ?? unit;
        Optional = optional;
        WholeNumber = wholeNumber;
        Value = value;
        Text = value is double v ? (wholeNumber ? v.ToString("0", CultureInfo.InvariantCulture) : FieldText.Format(v, unit)) : string.Empty;
    }

    /// <summary>JSON path of the field in the design file ("plant.powerStage.inductor.inductanceH"), as the core's validation names it.</summary>
    public string Path { get; internal set; }

    /// <summary>What the engineer calls it.</summary>
    public string Label { get; }

    /// <summary>Unit symbol accepted after the number ("H", "Hz", "Ohm"); empty for plain numbers.</summary>
    public string Unit { get; private set; }

    /// <summary>Unit shown beside the field.</summary>
    public string DisplayUnit { get; private set; }

    /// <summary>True when an empty field means "not set".</summary>
    public bool Optional { get; }

    /// <summary>True for counts.</summary>
    public bool WholeNumber { get; }

    /// <summary>The text as the user typed it.</summary>
    public string Text { get; private set; }

    /// <summary>The last value read from the text; null for an empty optional field (or a required one never filled).</summary>
    public double? Value { get; private set; }

    /// <summary>Why the current text cannot be read, or null when it can.</summary>
    public string? ParseError { get; private set; }

    /// <summary>True when the current text was read.</summary>
    public bool IsReadable => ParseError is null;

    /// <summary>Takes new text; keeps it whatever it is and reads a value from it when possible.</summary>
    /// <returns>True when the value changed.</returns>
    public bool SetText(string? text)
    {
        Text = text ?? string.Empty;
        var before = Value;
        var trimmed = Text.Trim();
        if (trimmed.Length == 0 && Optional)
        {
            ParseError = null;
            Value = null;
        }
        else if (!SiValue.TryParse(trimmed, Unit, out double v, out string error))
        {
            ParseError = error;
        }
        else if (WholeNumber && (v != Math.Floor(v) || Math.Abs(v) > int.MaxValue))
        {
            ParseError = $"'{trimmed}' is not a whole number.";
        }
        else
        {
            ParseError = null;
            Value = v;
        }

        return before != Value;
    }

    /// <summary>Sets a value from a control (slider, keyboard nudge) and writes it as text.</summary>
    public void SetValue(double value)
    {
        SetText(WholeNumber ? value.ToString("0", CultureInfo.InvariantCulture) : FieldText.Format(value, Unit, 4));
    }

    /// <summary>Changes the unit (the compensator gain is Hz or dB by kind) and rereads the text.</summary>
    public void Retarget(string unit, double? value, string? displayUnit = null)
    {
        Unit = unit;
        DisplayUnit = displayUnit ?? unit;
        if (value is double v)
        {
            SetValue(v);
        }
        else
        {
            SetText(Text);
        }
    }
}
