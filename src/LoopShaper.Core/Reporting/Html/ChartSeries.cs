using System.Collections.Immutable;

namespace LoopShaper.Core.Reporting.Html;

/// <summary>One line of an SVG chart.</summary>
/// <param name="Name">Legend text.</param>
/// <param name="Colour">CSS colour of the line.</param>
/// <param name="X">Abscissae (Hz for a frequency axis, s for time).</param>
/// <param name="Y">Ordinates; non-finite values break the line.</param>
/// <param name="Dashed">True for a dashed line.</param>
public sealed record ChartSeries(string Name, string Colour, ImmutableArray<double> X, ImmutableArray<double> Y, bool Dashed = false);
