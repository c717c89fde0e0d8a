namespace LoopShaper.Core.Synthesis;

/// <summary>
/// The series of preferred values of IEC 60063:2015: E6, E12 and E24 with two significant digits, E48, E96 and E192
/// with three. The number in the name is the count of values per decade.
/// </summary>
public enum ESeries
{
    /// <summary>6 values per decade, two digits (20 % steps).</summary>
    E6,

    /// <summary>12 values per decade, two digits (10 % steps).</summary>
    E12,

    /// <summary>24 values per decade, two digits (5 % steps).</summary>
    E24,

    /// <summary>48 values per decade, three digits (2 % steps).</summary>
    E48,

    /// <summary>96 values per decade, three digits (1 % steps).</summary>
    E96,

    /// <summary>192 values per decade, three digits (0.5 % steps and closer).</summary>
    E192,
}
