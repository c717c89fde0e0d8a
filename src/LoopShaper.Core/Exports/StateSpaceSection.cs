using System.Collections.Immutable;

namespace LoopShaper.Core.Exports;

/// <summary>
/// One first- or second-order section of a state-space realisation, in the normalised variable s' = s / w0 and in
/// controllable canonical form: H(s') = (b_m s'^m + ... + b0) / (s'^m + a_(m-1) s'^(m-1) + ... + a0), m = 1 or 2,
/// states x1' = x2, ..., x_m' = -a0 x1 - ... - a_(m-1) x_m + u, output y = sum (b_i - b_m a_i) x_(i+1) + b_m u
/// (controllable canonical form, Ogata, Modern Control Engineering, state-space chapter; edition and section from memory).
/// </summary>
/// <param name="ScaleRadPerS">w0: the frequency scale of the section, rad/s (d/dt = w0 d/dt').</param>
/// <param name="DenominatorAscending">a0 ... a_(m-1), the monic denominator's lower coefficients.</param>
/// <param name="NumeratorAscending">b0 ... b_m, the numerator's coefficients (m + 1 of them).</param>
public sealed record StateSpaceSection(double ScaleRadPerS, ImmutableArray<double> DenominatorAscending, ImmutableArray<double> NumeratorAscending)
{
    /// <summary>m: the section's order, its number of states.</summary>
    public int Order => DenominatorAscending.Length;

    /// <summary>d = b_m: the direct feed-through from u to y.</summary>
    public double Feedthrough => NumeratorAscending[Order];

    /// <summary>c_i = b_i - b_m a_i: the output weight of state x_(i+1).</summary>
    public double OutputWeight(int i) => NumeratorAscending[i] - (Feedthrough * DenominatorAscending[i]);
}
