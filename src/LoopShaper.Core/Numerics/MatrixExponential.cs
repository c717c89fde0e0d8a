using MathNet.Numerics.LinearAlgebra;

namespace LoopShaper.Core.Numerics;

/// <summary>
/// exp(A) by scaling and squaring with a diagonal Pade approximant of degree 6
/// (Golub and Van Loan, Matrix Computations, 3rd ed., algorithm 11.3.1).
/// </summary>
public static class MatrixExponential
{
    /// <summary>exp(A) for a square matrix A.</summary>
    public static Matrix<double> Of(Matrix<double> a)
    {
        const int q = 6;
        double norm = a.InfinityNorm();
        int j = norm > 0 ? Math.Max(0, (int)Math.Floor(Math.Log2(norm)) + 2) : 0;
        var x = a / Math.Pow(2, j);
        int n = a.RowCount;
        var ident = Matrix<double>.Build.DenseIdentity(n);
        var num = ident.Clone();
        var den = ident.Clone();
        var power = ident.Clone();
        double c = 1.0;
        for (int k = 1; k <= q; k++)
        {
            c = c * (q - k + 1) / (k * ((2 * q) - k + 1));
            power = x * power;
            num += c * power;
            den += (k % 2 == 0 ? c : -c) * power;
        }

        var e = den.Solve(num);
        for (int k = 0; k < j; k++)
        {
            e *= e;
        }

        return e;
    }
}
