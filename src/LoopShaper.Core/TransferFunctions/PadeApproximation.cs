using System.Numerics;
using LoopShaper.Core.Numerics;

namespace LoopShaper.Core.TransferFunctions;

/// <summary>
/// Pade approximation of a pure delay e^(-s Td) of order n (equal numerator and denominator degree):
/// coefficients c_k = (2n-k)! n! / ((2n)! k! (n-k)!), numerator sum (-1)^k c_k (s Td)^k, denominator sum c_k (s Td)^k
/// (Franklin, Powell and Emami-Naeini, Feedback Control of Dynamic Systems, sec. 5.6, from memory).
/// </summary>
public static class PadeApproximation
{
    /// <summary>Highest order offered; beyond it the coefficients lose accuracy in double precision.</summary>
    public const int MaxOrder = 10;

    /// <summary>The rational approximation of e^(-s delayS) of the given order, as a transfer function.</summary>
    public static TransferFunction Of(double delayS, int order)
    {
        if (order < 1 || order > MaxOrder)
        {
            throw new ArgumentOutOfRangeException(nameof(order), order, $"Pade order must be 1 to {MaxOrder}.");
        }

        if (delayS == 0.0)
        {
            return TransferFunction.Constant(1.0);
        }

        var c = new double[order + 1];
        c[0] = 1.0;
        for (int k = 1; k <= order; k++)
        {
            // c_k / c_{k-1} = (n - k + 1) / (k (2n - k + 1))
            c[k] = c[k - 1] * (order - k + 1) / (k * ((2.0 * order) - k + 1));
        }

        // Roots in x = s Td, then scaled to s.
        var den = new Polynomial(c);
        var num = new Polynomial(c.Select((v, k) => k % 2 == 0 ? v : -v));
        var poles = den.Roots().Select(r => r / delayS);
        var zeros = num.Roots().Select(r => r / delayS);
        return TransferFunction.FromRoots(1.0, 0, zeros, poles);
    }

    /// <summary>
    /// An order that keeps the approximation's phase error small up to a frequency of interest:
    /// n = ceil(w Td) + 2, limited to 2..10 (our rule, no source).
    /// </summary>
    public static int SuggestOrder(double delayS, double omegaOfInterest)
    {
        double x = Math.Abs(delayS * omegaOfInterest);
        int n = (int)Math.Ceiling(x) + 2;
        return Math.Clamp(n, 2, MaxOrder);
    }

    internal static Complex Exact(double delayS, double omega) => Complex.FromPolarCoordinates(1.0, -omega * delayS);
}
