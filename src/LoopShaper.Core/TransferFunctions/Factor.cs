using System.Numerics;

namespace LoopShaper.Core.TransferFunctions;

/// <summary>
/// A zero or pole given as an engineer writes it: a real root at a frequency in Hz, or a complex pair by its
/// natural frequency in Hz and quality factor Q. Left half plane unless <see cref="RightHalfPlane"/> is set.
/// </summary>
/// <param name="FrequencyHz">Corner or natural frequency in Hz, finite and positive.</param>
/// <param name="Q">Quality factor of a complex pair; null for a single real root.</param>
/// <param name="RightHalfPlane">True for a root in the right half plane (a right-half-plane zero adds lag).</param>
public sealed record Factor(double FrequencyHz, double? Q = null, bool RightHalfPlane = false)
{
    /// <summary>A single real root at -2 pi f (or +2 pi f in the right half plane).</summary>
    public static Factor Real(double frequencyHz, bool rightHalfPlane = false) => new(frequencyHz, null, rightHalfPlane);

    /// <summary>A complex pair with natural frequency f0 and quality factor Q: s^2 + (w0/Q) s + w0^2.</summary>
    public static Factor Pair(double frequencyHz, double q, bool rightHalfPlane = false) => new(frequencyHz, q, rightHalfPlane);

    /// <summary>Number of roots this factor stands for (1 or 2).</summary>
    public int Order => Q is null ? 1 : 2;

    /// <summary>The roots in rad/s: w0 (-1/(2Q) +- j sqrt(1 - 1/(4Q^2))), real roots when Q &lt;= 0.5.</summary>
    public IEnumerable<Complex> Roots()
    {
        double w0 = 2.0 * Math.PI * FrequencyHz;
        double sign = RightHalfPlane ? 1.0 : -1.0;
        if (Q is not double q)
        {
            yield return new Complex(sign * w0, 0);
            yield break;
        }

        double zeta = 1.0 / (2.0 * q);
        if (zeta < 1.0)
        {
            double im = w0 * Math.Sqrt(1.0 - (zeta * zeta));
            yield return new Complex(sign * zeta * w0, im);
            yield return new Complex(sign * zeta * w0, -im);
        }
        else
        {
            double d = w0 * Math.Sqrt((zeta * zeta) - 1.0);
            yield return new Complex(sign * ((zeta * w0) - d), 0);
            yield return new Complex(sign * ((zeta * w0) + d), 0);
        }
    }
}
