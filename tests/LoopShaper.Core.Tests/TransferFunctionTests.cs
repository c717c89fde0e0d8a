using System.Numerics;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Tests;

public class TransferFunctionTests
{
    [Fact]
    public void Coefficients_and_factors_describe_the_same_function()
    {
        // 1000 (1 + s/100) / ((1 + s/10)(1 + s/1e4)): coefficients multiplied out by hand.
        var fromFactors = TransferFunction.FromFactors(1000, 0, [Factor.Real(100 / (2 * Math.PI))], [Factor.Real(10 / (2 * Math.PI)), Factor.Real(1e4 / (2 * Math.PI))]);
        var fromCoefficients = TransferFunction.FromCoefficients([10.0, 1000.0], [1e-5, 0.1001, 1.0]);
        foreach (double f in new[] { 0.1, 3.0, 100.0, 5e3 })
        {
            var a = fromFactors.EvaluateHz(f);
            var b = fromCoefficients.EvaluateHz(f);
            Assert.True(Complex.Abs(a - b) <= 1e-12 * Complex.Abs(a), $"at {f} Hz: {a} vs {b}");
        }
    }

    [Fact]
    public void Feedback_of_an_integrator_is_a_first_order_lag()
    {
        // 10/s closed in unity feedback: 10 / (s + 10) (textbook identity).
        var loop = TransferFunction.FromCoefficients([10.0], [1.0, 0.0]);
        var closed = loop.Feedback(TransferFunction.Constant(1.0));
        Assert.Equal(1.0, closed.DcGain!.Value, 12);
        Assert.Single(closed.Poles);
        Assert.Equal(-10.0, closed.Poles[0].Real, 9);
    }
}
