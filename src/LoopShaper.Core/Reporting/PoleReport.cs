namespace LoopShaper.Core.Reporting;

/// <summary>A closed-loop pole s = 2 pi (RealHz + j ImaginaryHz): the root in rad/s divided by 2 pi.</summary>
/// <param name="RealHz">Real part over 2 pi, Hz (negative in the left half plane).</param>
/// <param name="ImaginaryHz">Imaginary part over 2 pi, Hz.</param>
public sealed record PoleReport(double? RealHz, double? ImaginaryHz);
