using System.Globalization;
using System.Text;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Design;
using LoopShaper.Core.Measurements;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Tests.Measurements;

/// <summary>
/// Margins from a measurement: a synthetic measurement (the model sampled densely, phase wrapped into (-180, 180] as
/// an instrument writes it, through the CSV reader) must give the model's margins within 0.1 degree (the tolerance the
/// issue sets; linear interpolation in log f between samples 1/200 decade apart is far closer). Model margins come
/// from closed forms where one exists, otherwise from MarginAnalyzer (Brent on the analytic function): a
/// cross-method check, sampled vs analytic.
/// </summary>
public class SampledMarginTests
{
    private const double TwoPi = 2.0 * Math.PI;

    /// <summary>The response sampled at pointsPerDecade on a log grid, written as an instrument would: wrapped phase, CSV with a header.</summary>
    private static string SyntheticCsv(TransferFunction h, double startHz, double stopHz, int pointsPerDecade, double phaseOffsetDeg = 0.0)
    {
        int n = (int)Math.Round(Math.Log10(stopHz / startHz) * pointsPerDecade) + 1;
        var f = Enumerable.Range(0, n).Select(i => startHz * Math.Pow(stopHz / startHz, i / (double)(n - 1))).ToArray();
        var r = FrequencyResponse.Of(h, f);
        var sb = new StringBuilder("Frequency (Hz),Gain (dB),Phase (deg)\n");
        for (int i = 0; i < n; i++)
        {
            double wrapped = Wrap(r.PhaseDeg[i] + phaseOffsetDeg);
            sb.Append(string.Create(CultureInfo.InvariantCulture, $"{f[i]:R},{r.MagnitudeDb[i]:R},{wrapped:R}\n"));
        }

        return sb.ToString();
    }

    private static double Wrap(double deg)
    {
        double w = deg - (360.0 * Math.Floor((deg + 180.0) / 360.0));
        return w == -180.0 ? 180.0 : w;
    }

    private static MeasuredResponse Read(string csv)
    {
        var result = MeasuredCsvReader.Read(csv);
        Assert.True(result.Succeeded, string.Join("\n", result.Errors));
        return result.Response!;
    }

    [Fact]
    public void Integrator_with_one_pole_gives_45_degrees_at_the_pole()
    {
        // T(s) = K / (s (1 + s/p)) with K = p sqrt(2): |T(j p)| = K / (p sqrt 2) = 1, so fc = fp; PM = 180 - 90 - atan(1)
        // = 45 degrees (sum of factor angles, closed form). The phase never reaches -180: no gain margin.
        double fp = 10e3, p = TwoPi * fp;
        var t = TransferFunction.FromRoots(p * Math.Sqrt(2.0), -1, [], [new System.Numerics.Complex(-p, 0)]);
        var measured = Read(SyntheticCsv(t, 100, 1e6, 200));
        Assert.True(measured.PhaseWasWrapped || measured.Samples.PhaseDeg.All(x => x > -180));
        var m = SampledMarginFinder.Find(measured.Samples);
        var c = Assert.Single(m.GainCrossovers);
        Assert.Equal(45.0, c.PhaseMarginDeg, 0.1);
        Assert.Equal(fp, c.FrequencyHz, fp * 0.002);
        Assert.True(c.Falling);
        Assert.Null(m.UpperGainMarginDb);
    }

    [Fact]
    public void Third_order_type_1_loop_gives_the_routh_hurwitz_gain_margin()
    {
        // K / (s (s + 1)(s + 5)), K = 10: phase -180 at w = sqrt 5 rad/s, where |T| = K / 30 (Routh-Hurwitz: critical
        // K = 30), so GM = 20 log10 3 = 9.542 dB. Phase margin from MarginAnalyzer (analytic, Brent).
        var t = TransferFunction.FromCoefficients([10.0], [1.0, 6.0, 5.0, 0.0]);
        double start = 0.01 / TwoPi, stop = 100 / TwoPi;
        var model = MarginAnalyzer.Analyze(t, start, stop);
        var m = SampledMarginFinder.Find(Read(SyntheticCsv(t, start, stop, 200)).Samples);
        Assert.Equal(20 * Math.Log10(3.0), m.UpperGainMarginDb!.Value, 0.01);
        Assert.Equal(Math.Sqrt(5.0) / TwoPi, m.PhaseCrossovers.Single().FrequencyHz, 0.001 * Math.Sqrt(5.0) / TwoPi);
        Assert.Equal(model.PhaseMarginDeg!.Value, m.PhaseMarginDeg!.Value, 0.1);
        Assert.Equal(model.CrossoverHz!.Value, m.CrossoverHz!.Value, 0.002 * model.CrossoverHz.Value);
    }

    [Fact]
    public void Conditionally_stable_loop_gives_upper_and_lower_gain_margins()
    {
        // MARGIN-CASES 5: K (s + 1)^2 / s^3 with K = 10 dips below -180 where |T| > 1. Both gain margins from
        // MarginAnalyzer (analytic), sampled must agree within 0.05 dB.
        var t = TransferFunction.FromCoefficients([10.0, 20.0, 10.0], [1.0, 0.0, 0.0, 0.0]);
        double start = 0.01 / TwoPi, stop = 1000 / TwoPi;
        var model = MarginAnalyzer.Analyze(t, start, stop);
        // 1/s^3 starts at -270 degrees; the wrapped file starts at +90. Only the model fixes the turn (alignment), so the
        // samples go through MeasurementComparison with T as the whole loop; read as given they are one turn off.
        var measured = Read(SyntheticCsv(t, start, stop, 200));
        var asGiven = SampledMarginFinder.Find(measured.Samples);
        Assert.Equal(model.PhaseMarginDeg!.Value + 360.0, asGiven.PhaseMarginDeg!.Value, 0.1);
        var loop = new Loop.LoopModel(t, TransferFunction.Constant(1.0), TransferFunction.Constant(1.0), 1.0, 1.0, null, null);
        var comparison = MeasurementComparison.Of(measured, MeasuredQuantity.LoopGain, loop);
        Assert.Equal(-360.0, comparison.PhaseAlignmentDeg);
        var m = comparison.MeasuredMargins;
        Assert.NotNull(model.LowerGainMarginDb);
        Assert.Equal(model.LowerGainMarginDb!.Value, m.LowerGainMarginDb!.Value, 0.05);
        Assert.Equal(model.PhaseMarginDeg!.Value, m.PhaseMarginDeg!.Value, 0.1);
        Assert.Equal(model.PhaseCrossovers.Length, m.PhaseCrossovers.Length);
    }

    [Theory]
    [InlineData("core-rail-12v-to-1v0.json", MeasuredQuantity.LoopGain)]
    [InlineData("core-rail-12v-to-1v0.json", MeasuredQuantity.Plant)]
    [InlineData("pol-12v-to-3v3-peak-current-mode.json", MeasuredQuantity.LoopGain)]
    [InlineData("industrial-24v-to-5v.json", MeasuredQuantity.Plant)]
    public void A_dense_synthetic_measurement_of_an_example_design_gives_the_model_margins(string example, MeasuredQuantity quantity)
    {
        var design = DesignFile.Read(File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", example))).Design!;
        var analysis = DesignAnalyzer.Analyze(design);
        var loop = analysis.Loop!;
        var model = analysis.Margins!;
        var h = quantity == MeasuredQuantity.LoopGain ? loop.LoopGain : loop.Plant;
        var measured = Read(SyntheticCsv(h, model.StartHz, model.StopHz, 200));

        var comparison = MeasurementComparison.Of(measured, quantity, loop);

        Assert.Equal(model.PhaseMarginDeg!.Value, comparison.MeasuredMargins.PhaseMarginDeg!.Value, 0.1);
        Assert.Equal(model.CrossoverHz!.Value, comparison.MeasuredMargins.CrossoverHz!.Value, 0.002 * model.CrossoverHz.Value);
        Assert.Equal(model.GainCrossovers.Length, comparison.MeasuredMargins.GainCrossovers.Length);
        if (model.UpperGainMarginDb is double gm)
        {
            Assert.Equal(gm, comparison.MeasuredMargins.UpperGainMarginDb!.Value, 0.1);
        }

        // The measurement is the model itself: the difference is round-off only (CSV written with "R", exact round trip).
        Assert.True(comparison.Difference.MaxAbsGainDb < 1e-9, $"gain difference {comparison.Difference.MaxAbsGainDb}");
        Assert.True(comparison.Difference.MaxAbsPhaseDeg < 1e-9, $"phase difference {comparison.Difference.MaxAbsPhaseDeg}");
    }

    [Fact]
    public void A_measurement_one_turn_off_is_aligned_to_the_model_and_the_difference_shows_a_real_offset()
    {
        // An instrument's phase is known modulo 360 only: +360 on every sample is aligned away (-360), while a gain
        // error of +2 dB and a phase error of -5 degrees remain as the difference.
        var design = DesignFile.Read(File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", "core-rail-12v-to-1v0.json"))).Design!;
        var loop = DesignAnalyzer.Analyze(design).Loop!;
        var measured = Read(SyntheticCsv(loop.LoopGain.Scale(Math.Pow(10, 2.0 / 20)), 100, 1e6, 50, phaseOffsetDeg: 355.0));
        var comparison = MeasurementComparison.Of(measured, MeasuredQuantity.LoopGain, loop);
        Assert.All(comparison.Difference.GainDb, d => Assert.Equal(2.0, d, 1e-9));
        Assert.All(comparison.Difference.PhaseDeg, d => Assert.Equal(-5.0, d, 1e-9));
    }

    [Fact]
    public void Nothing_is_extrapolated_beyond_the_samples()
    {
        // MARGIN-CASES 3: the samples stop before 0 dB is reached: no crossover is invented.
        var t = TransferFunction.FromCoefficients([10.0], [1.0, 6.0, 5.0, 0.0]);
        var m = SampledMarginFinder.Find(Read(SyntheticCsv(t, 0.01 / TwoPi, 0.1 / TwoPi, 50)).Samples);
        Assert.Empty(m.GainCrossovers);
        Assert.Null(m.PhaseMarginDeg);
    }

    private static string RepoRoot()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
        {
            if (File.Exists(Path.Combine(d.FullName, "LoopShaper.sln")))
            {
                return d.FullName;
            }
        }

        throw new InvalidOperationException("LoopShaper.sln not found above " + AppContext.BaseDirectory);
    }
}
