using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Tests;

/// <summary>
/// One or more tests for every hard case of shared/MARGIN-CASES.md (numbered as there), plus invariants that hold for
/// any loop. Frequencies in the derivations are in rad/s unless marked Hz; the core takes Hz.
/// Expected values come from closed forms derived in the comments (Routh-Hurwitz and the arctangent sums of the
/// factor angles, as in any control textbook, e.g. Franklin, Powell and Emami-Naeini, Feedback Control of Dynamic
/// Systems, ch. 3 and 6, from memory), never from the code under test.
/// </summary>
public class MarginCasesTests
{
    private const double TwoPi = 2.0 * Math.PI;
    private const double Deg = 180.0 / Math.PI;

    private static double Hz(double omega) => omega / TwoPi;

    private static double Db(double linear) => 20.0 * Math.Log10(linear);

    private static void AssertRelative(double expected, double actual, double relTol, string what)
        => Assert.True(Math.Abs(actual - expected) <= relTol * Math.Abs(expected), $"{what}: expected {expected:R}, got {actual:R} (relative tolerance {relTol})");

    private static void AssertClose(double expected, double actual, double absTol, string what)
        => Assert.True(Math.Abs(actual - expected) <= absTol, $"{what}: expected {expected:R}, got {actual:R} (tolerance {absTol})");

    /// <summary>K / (s (s + 1)(s + 5)), written with its polynomial as Octave's tf would take it.</summary>
    private static TransferFunction ThirdOrderType1(double k) => TransferFunction.FromCoefficients([k], [1.0, 6.0, 5.0, 0.0]);

    // ---------------------------------------------------------------------------------------------------------
    // Case 1: poles at the origin, phase start.
    // ---------------------------------------------------------------------------------------------------------

    [Fact]
    public void Case01_triple_integrator_starts_at_minus_270_degrees_never_plus_90()
    {
        // 1/s^3: arg (j w)^-3 = -3 x 90 = -270 degrees at every frequency (shared/CONVENTIONS.md start rule).
        var fromPolynomial = TransferFunction.FromCoefficients([1.0], [1.0, 0.0, 0.0, 0.0]);
        var fromRoots = TransferFunction.FromRoots(1.0, -3, [], []);
        foreach (var h in new[] { fromPolynomial, fromRoots })
        {
            Assert.Equal(-3, h.OriginOrder);
            foreach (double f in new[] { 1e-6, 1e-2, 1.0, 1e3, 1e9 })
            {
                AssertClose(-270.0, h.PhaseDeg(f), 1e-12, $"phase of 1/s^3 at {f} Hz");
            }
        }

        var response = FrequencyResponse.Of(fromPolynomial, new FrequencyGrid(1e-3, 1e6, 200));
        Assert.All(response.PhaseDeg, p => AssertClose(-270.0, p, 1e-12, "plotted phase of 1/s^3"));
    }

    [Fact]
    public void Case01_single_integrator_starts_at_minus_90_degrees()
    {
        // 1/s: -90 degrees everywhere; 1/(s (s + 1)) at w = 1e-6 rad/s: -90 - atan(1e-6) = -90 - 5.73e-5 degrees.
        var integrator = TransferFunction.FromCoefficients([1.0], [1.0, 0.0]);
        AssertClose(-90.0, integrator.PhaseDeg(1e-3), 1e-12, "phase of 1/s");
        AssertClose(-90.0, integrator.PhaseDeg(1e6), 1e-12, "phase of 1/s");

        var withPole = TransferFunction.FromCoefficients([1.0], [1.0, 1.0, 0.0]);
        AssertClose(-90.0 - (Math.Atan(1e-6) * Deg), withPole.PhaseDeg(Hz(1e-6)), 1e-12, "phase of 1/(s(s+1)) at 1e-6 rad/s");
    }

    [Theory]
    [InlineData(0.5)] // repeated real pole: 1/(s (s + 1)^2), whose polynomial roots split by round-off
    [InlineData(50.0)] // lightly damped pair: 1/(s (s^2 + s/50 + 1))
    public void Case01_integrator_with_double_pole_never_jumps_by_360_degrees(double q)
    {
        // Denominator s (s^2 + s/Q + 1). Every factor is a left-half-plane pole, so the continuous phase falls
        // monotonically from -90 (w -> 0) to -270 (w -> infinity) and is exactly -180 at w = 1 rad/s.
        // A wrapped phase would jump by +360 where it passes -180.
        var h = TransferFunction.FromCoefficients([1.0], [1.0, 1.0 / q, 1.0, 0.0]);
        var response = FrequencyResponse.Of(h, new FrequencyGrid(Hz(1e-4), Hz(1e4), 4000));
        for (int i = 1; i < response.Count; i++)
        {
            double step = response.PhaseDeg[i] - response.PhaseDeg[i - 1];
            Assert.True(step <= 1e-9, $"phase rose by {step} degrees between {response.FrequencyHz[i - 1]} and {response.FrequencyHz[i]} Hz");
        }

        AssertClose(-90.0, response.PhaseDeg[0], 0.05, "phase at 1e-4 rad/s");
        AssertClose(-270.0, response.PhaseDeg[^1], 0.05, "phase at 1e4 rad/s");
        AssertClose(-180.0, h.PhaseDeg(Hz(1.0)), 1e-6, "phase at the natural frequency");
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 2: spurious crossing from sampled data; coefficients spanning many decades.
    // ---------------------------------------------------------------------------------------------------------

    /// <summary>T(s) = 1e15 / (10 s^2 + 1.01e7 s + 1e11) = 1e14 / ((s + 1e4)(s + 1e6)), DC gain 1e4 (80 dB).</summary>
    private static TransferFunction WideSpanLoop() => TransferFunction.FromCoefficients([1e15], [10.0, 1.01e7, 1e11]);

    [Fact]
    public void Case02_wide_span_coefficients_give_the_exact_poles()
    {
        // 10 s^2 + 1.01e7 s + 1e11 = 10 (s + 1e4)(s + 1e6).
        var t = WideSpanLoop();
        var poles = t.Poles.Select(p => p.Real).Order().ToArray();
        Assert.Equal(2, poles.Length);
        AssertRelative(-1e6, poles[0], 1e-12, "fast pole");
        AssertRelative(-1e4, poles[1], 1e-12, "slow pole");
        Assert.All(t.Poles, p => Assert.Equal(0.0, p.Imaginary));
        AssertRelative(1e4, t.DcGain!.Value, 1e-12, "DC gain");
    }

    [Fact]
    public void Case02_wide_span_loop_has_no_phase_crossover_over_a_wide_range()
    {
        // Phase = -atan(w/1e4) - atan(w/1e6) > -180 for every finite w: no phase crossover, hence no gain margin.
        // Gain crossover: |T|^2 = 1e28 / ((w^2 + 1e8)(w^2 + 1e12)) = 1, i.e. x = w^2 solves
        // x^2 + (1e12 + 1e8) x + (1e20 - 1e28) = 0, x = (-(b) + sqrt(b^2 + 4 (1e28 - 1e20))) / 2. The crossover sits
        // near 9.95e6 rad/s = 1.58 MHz, where a sampled search once claimed a phase crossover.
        double b = 1e12 + 1e8;
        double x = (-b + Math.Sqrt((b * b) + (4.0 * (1e28 - 1e20)))) / 2.0;
        double wc = Math.Sqrt(x);
        double pm = 180.0 - (Math.Atan(wc / 1e4) * Deg) - (Math.Atan(wc / 1e6) * Deg);

        var m = MarginAnalyzer.Analyze(WideSpanLoop(), 1e-3, 1e12);
        Assert.Empty(m.PhaseCrossovers);
        Assert.Null(m.UpperGainMarginDb);
        Assert.Null(m.LowerGainMarginDb);
        var crossover = Assert.Single(m.GainCrossovers);
        AssertRelative(Hz(wc), crossover.FrequencyHz, 1e-9, "gain crossover");
        AssertClose(pm, m.PhaseMarginDeg!.Value, 1e-7, "phase margin");
        // Closed loop 10 s^2 + 1.01e7 s + (1e11 + 1e15): all coefficients positive, second order: stable.
        Assert.True(m.IsClosedLoopStable);
    }

    [Fact]
    public void Case02_nothing_is_extrapolated_beyond_the_analysed_range()
    {
        // Up to 100 kHz the loop gain is still above 0 dB (crossover at 1.58 MHz): no crossing is invented,
        // and a note says that the crossover lies above the range.
        var m = MarginAnalyzer.Analyze(WideSpanLoop(), 1.0, 1e5);
        Assert.Empty(m.GainCrossovers);
        Assert.Empty(m.PhaseCrossovers);
        Assert.Null(m.PhaseMarginDeg);
        Assert.Contains(m.Notes, n => n.Contains("above the analysed range"));
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 3: crossings at the edge of the grid.
    // ---------------------------------------------------------------------------------------------------------

    /// <summary>w_c / s with w_c = 2 pi 1 kHz: |T| = 1000 Hz / f, so the gain crossover is exactly at 1000 Hz, PM 90 degrees.</summary>
    private static TransferFunction IntegratorAt1kHz() => TransferFunction.FromFactors(TwoPi * 1000.0, -1, [], []);

    [Fact]
    public void Case03_gain_crossing_exactly_at_the_first_frequency_is_reported()
    {
        var m = MarginAnalyzer.Analyze(IntegratorAt1kHz(), 1000.0, 1e5);
        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(1000.0, c.FrequencyHz, 1e-9, "crossover at the first point");
        AssertClose(90.0, c.PhaseMarginDeg, 1e-9, "phase margin");
    }

    [Fact]
    public void Case03_gain_crossing_exactly_at_the_last_frequency_is_reported()
    {
        var m = MarginAnalyzer.Analyze(IntegratorAt1kHz(), 10.0, 1000.0);
        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(1000.0, c.FrequencyHz, 1e-9, "crossover at the last point");
    }

    [Fact]
    public void Case03_gain_crossing_just_outside_the_range_is_not_reported_but_noted()
    {
        var above = MarginAnalyzer.Analyze(IntegratorAt1kHz(), 1000.0 * (1 + 1e-6), 1e5);
        Assert.Empty(above.GainCrossovers);
        Assert.Contains(above.Notes, n => n.Contains("below 0 dB") && n.Contains("lower end"));

        var below = MarginAnalyzer.Analyze(IntegratorAt1kHz(), 10.0, 1000.0 * (1 - 1e-6));
        Assert.Empty(below.GainCrossovers);
        Assert.Contains(below.Notes, n => n.Contains("above 0 dB") && n.Contains("upper end"));
    }

    [Fact]
    public void Case03_phase_crossing_exactly_at_the_last_frequency_is_reported()
    {
        // K / (s (s+1)(s+5)): phase -90 - atan(w) - atan(w/5) = -180 when atan(w) + atan(w/5) = 90, i.e. w * w/5 = 1,
        // w = sqrt(5) rad/s. There |T| = K / (sqrt5 sqrt6 sqrt30) = K / 30, so GM = 20 log10(30 / K) (Routh:
        // s^3 + 6 s^2 + 5 s + K is marginal at K = 30; textbook result). K = 3 gives exactly 20 dB.
        double f180 = Hz(Math.Sqrt(5.0));
        var m = MarginAnalyzer.Analyze(ThirdOrderType1(3.0), 0.01, f180);
        var p = Assert.Single(m.PhaseCrossovers);
        AssertRelative(f180, p.FrequencyHz, 1e-9, "phase crossover at the last point");
        AssertClose(20.0, p.GainMarginDb, 1e-9, "gain margin");
    }

    [Fact]
    public void Case03_phase_crossing_exactly_at_the_first_frequency_is_reported()
    {
        // Same loop, range starting exactly at sqrt(5) rad/s (the double nearest to it): the crossing lies on the
        // first grid point and must be reported, as it is at the last point.
        double f180 = Hz(Math.Sqrt(5.0));
        var m = MarginAnalyzer.Analyze(ThirdOrderType1(3.0), f180, 10.0);
        var p = Assert.Single(m.PhaseCrossovers);
        AssertRelative(f180, p.FrequencyHz, 1e-9, "phase crossover at the first point");
        AssertClose(20.0, p.GainMarginDb, 1e-9, "gain margin");
    }

    [Fact]
    public void Case03_phase_crossing_just_outside_the_range_is_not_reported()
    {
        double f180 = Hz(Math.Sqrt(5.0));
        Assert.Empty(MarginAnalyzer.Analyze(ThirdOrderType1(3.0), f180 * (1 + 1e-6), 10.0).PhaseCrossovers);
        var below = MarginAnalyzer.Analyze(ThirdOrderType1(3.0), 0.01, f180 * (1 - 1e-6));
        Assert.Empty(below.PhaseCrossovers);
        Assert.Null(below.UpperGainMarginDb);
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 4: several gain crossovers.
    // ---------------------------------------------------------------------------------------------------------

    /// <summary>T(jw) = (w1 / jw) / (1 - w^2/w0^2 + j w/(Q w0)), evaluated directly (not through the core).</summary>
    private static Complex ResonantIntegrator(double w, double w1, double w0, double q)
        => w1 / new Complex(0, w) / new Complex(1 - (w * w / (w0 * w0)), w / (q * w0));

    [Fact]
    public void Case04_three_gain_crossovers_with_margins_of_both_signs_are_all_listed_and_flagged()
    {
        // T = (w1/s) / (s^2/w0^2 + s/(Q w0) + 1), w1 = 1, w0 = 10 rad/s, Q = 50. |T(j w0)| = (w1/w0) Q = 5 > 1, so
        // after the integrator's crossover near 1 rad/s the resonance lifts |T| above 0 dB again: three crossings.
        // Phase = -90 - theta, theta = arg of the pair in [0, 180]; below w0 theta < 90 (PM = 90 - theta > 0),
        // above w0 theta > 90 (PM < 0).
        const double w1 = 1.0, w0 = 10.0, q = 50.0;
        var t = TransferFunction.FromFactors(w1, -1, [], [Factor.Pair(Hz(w0), q)]);
        var m = MarginAnalyzer.Analyze(t, Hz(0.01), Hz(1000.0));

        // Independent count: sign changes of ln|T| - 0 on a dense grid of the direct formula.
        int count = 0;
        double prev = double.NaN;
        for (int i = 0; i <= 200_000; i++)
        {
            double w = 0.01 * Math.Pow(1e5, i / 200_000.0);
            double g = Math.Log(Complex.Abs(ResonantIntegrator(w, w1, w0, q)));
            if (i > 0 && Math.Sign(g) != Math.Sign(prev))
            {
                count++;
            }

            prev = g;
        }

        Assert.Equal(3, count);
        Assert.Equal(3, m.GainCrossovers.Length);
        Assert.True(m.HasMultipleCrossovers);
        Assert.Contains(m.Notes, n => n.Contains("crosses 0 dB 3 times"));

        foreach (var c in m.GainCrossovers)
        {
            double w = TwoPi * c.FrequencyHz;
            var direct = ResonantIntegrator(w, w1, w0, q);
            AssertClose(1.0, Complex.Abs(direct), 1e-9, $"|T| at {c.FrequencyHz} Hz");
            double theta = Math.Atan2(w / (q * w0), 1 - (w * w / (w0 * w0))) * Deg;
            AssertClose(90.0 - theta, c.PhaseMarginDeg, 1e-7, $"phase margin at {c.FrequencyHz} Hz");
        }

        Assert.True(m.GainCrossovers[0].PhaseMarginDeg > 0);
        Assert.True(m.GainCrossovers[1].PhaseMarginDeg > 0);
        Assert.True(m.GainCrossovers[2].PhaseMarginDeg < 0);
        Assert.True(m.GainCrossovers[0].Falling && !m.GainCrossovers[1].Falling && m.GainCrossovers[2].Falling);
        Assert.Equal(m.GainCrossovers.Min(c => c.PhaseMarginDeg), m.PhaseMarginDeg);
        Assert.Equal(m.GainCrossovers[2].FrequencyHz, m.CrossoverHz);

        // Closed loop: s (s^2/100 + s/500 + 1) + 1 = 0, times 100: s^3 + 0.2 s^2 + 100 s + 100. Routh needs
        // 0.2 x 100 > 1 x 100, which fails: unstable, and no delay margin is offered.
        Assert.False(m.IsClosedLoopStable);
        Assert.Null(m.DelayMarginS);
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 5: conditionally stable loops.
    // ---------------------------------------------------------------------------------------------------------

    /// <summary>T = 10 (1 + s)^2 / (s^3 (1 + s/100)^2).</summary>
    private static TransferFunction ConditionallyStableLoop()
        => TransferFunction.FromFactors(10.0, -3, [Factor.Real(Hz(1.0)), Factor.Real(Hz(1.0))], [Factor.Real(Hz(100.0)), Factor.Real(Hz(100.0))]);

    private static double ConditionallyStableMagnitude(double w) => 10.0 * (1 + (w * w)) / (w * w * w * (1 + (w * w / 1e4)));

    [Fact]
    public void Case05_conditionally_stable_loop_reports_both_gain_margins_signed()
    {
        // Phase = -270 + 2 atan(w) - 2 atan(w/100). It equals -180 where atan(w) - atan(w/100) = 45 degrees:
        // (w - w/100) / (1 + w^2/100) = 1, i.e. w^2 - 99 w + 100 = 0, w = (99 -+ sqrt(9401)) / 2
        // = 1.0209 (phase rising through -180, |T| > 1) and 97.979 rad/s (falling, |T| < 1).
        // |T| = 10 (1 + w^2) / (w^3 (1 + w^2/1e4)); |T(10)| = 10 * 101 / (1000 * 1.01) = 1: crossover at 10 rad/s,
        // PM = -90 + 2 (atan 10 - atan 0.1) = 2 atan(4.95) - 90 = 67.16 degrees.
        double wa = (99.0 - Math.Sqrt(9401.0)) / 2.0, wb = (99.0 + Math.Sqrt(9401.0)) / 2.0;
        double lowerDb = -Db(ConditionallyStableMagnitude(wa)), upperDb = -Db(ConditionallyStableMagnitude(wb));
        var m = MarginAnalyzer.Analyze(ConditionallyStableLoop(), Hz(1e-3), Hz(1e5));

        Assert.Equal(2, m.PhaseCrossovers.Length);
        AssertRelative(Hz(wa), m.PhaseCrossovers[0].FrequencyHz, 1e-9, "rising phase crossover");
        AssertRelative(Hz(wb), m.PhaseCrossovers[1].FrequencyHz, 1e-9, "falling phase crossover");
        Assert.All(m.PhaseCrossovers, p => Assert.Equal(-180.0, p.CriticalPhaseDeg));
        Assert.True(lowerDb < 0 && upperDb > 0);
        AssertClose(lowerDb, m.LowerGainMarginDb!.Value, 1e-7, "lower gain margin");
        AssertClose(upperDb, m.UpperGainMarginDb!.Value, 1e-7, "upper gain margin");
        AssertRelative(Hz(wa), m.LowerGainMarginHz!.Value, 1e-9, "lower gain margin frequency");
        AssertRelative(Hz(wb), m.UpperGainMarginHz!.Value, 1e-9, "upper gain margin frequency");

        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(Hz(10.0), c.FrequencyHz, 1e-9, "gain crossover");
        AssertClose((2 * Math.Atan(4.95) * Deg) - 90.0, c.PhaseMarginDeg, 1e-8, "phase margin");

        // Closed loop, times 1e4: s^5 + 200 s^4 + 1e4 s^3 + 1e5 s^2 + 2e5 s + 1e5. Routh first column:
        // 1, 200, 9500, 95800, 1.896e5, 1e5, all positive: stable, so the loop is conditionally stable.
        Assert.True(m.IsClosedLoopStable);
        Assert.True(m.IsConditionallyStable);
        AssertClose(-270.0, ConditionallyStableLoop().PhaseDeg(Hz(1e-6)), 1e-3, "phase start with three integrators");
    }

    [Theory]
    [InlineData(0.95, false)]
    [InlineData(1.05, true)]
    public void Case05_gain_reduced_past_the_lower_margin_destabilises(double factorOfMargin, bool stable)
    {
        // Scaling by k = 10^(GM_lower/20) puts T(j wa) on -1. A little less gain (0.95 k) must leave the closed loop
        // unstable, a little more (1.05 k) stable: the closed-loop poles confirm the sign and size of the margin.
        var loop = ConditionallyStableLoop();
        double k = Math.Pow(10, MarginAnalyzer.Analyze(loop, Hz(1e-3), Hz(1e5)).LowerGainMarginDb!.Value / 20);
        var scaled = MarginAnalyzer.Analyze(loop.Scale(k * factorOfMargin), Hz(1e-3), Hz(1e5));
        Assert.Equal(stable, scaled.IsClosedLoopStable);
    }

    [Theory]
    [InlineData(0.95, true)]
    [InlineData(1.05, false)]
    public void Case05_gain_raised_past_the_upper_margin_destabilises(double factorOfMargin, bool stable)
    {
        var loop = ConditionallyStableLoop();
        double k = Math.Pow(10, MarginAnalyzer.Analyze(loop, Hz(1e-3), Hz(1e5)).UpperGainMarginDb!.Value / 20);
        var scaled = MarginAnalyzer.Analyze(loop.Scale(k * factorOfMargin), Hz(1e-3), Hz(1e5));
        Assert.Equal(stable, scaled.IsClosedLoopStable);
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 6: right-half-plane open-loop poles.
    // ---------------------------------------------------------------------------------------------------------

    [Fact]
    public void Case06_round_off_pole_at_plus_1e_minus_17_from_a_polynomial_is_scrubbed()
    {
        // s^3 + 6 s^2 + 5 s - 5e-17 has a root at +1e-17 (= 5e-17 / 5 to first order) beside -1 and -5: round-off
        // of the integrator's s = 0. Scrubbed, the loop must be the same as 3 / (s (s+1)(s+5)): GM = 20 log10(30/3)
        // = 20 dB at sqrt(5) rad/s (Routh, see case 3), no right-half-plane pole, stable closed loop.
        var noisy = TransferFunction.FromCoefficients([3.0], [1.0, 6.0, 5.0, -5e-17]);
        var exact = ThirdOrderType1(3.0);
        Assert.Equal(-1, noisy.OriginOrder);
        foreach (double w in new[] { 0.01, 1.0, 100.0 })
        {
            var a = noisy.Evaluate(w);
            var b = exact.Evaluate(w);
            Assert.True(Complex.Abs(a - b) <= 1e-9 * Complex.Abs(b), $"at {w} rad/s: scrubbed {a} vs exact {b}");
        }

        var m = MarginAnalyzer.Analyze(noisy, Hz(1e-3), Hz(1e3));
        Assert.Equal(0, m.OpenLoopRhpPoleCount);
        AssertClose(20.0, m.UpperGainMarginDb!.Value, 1e-9, "gain margin");
        AssertRelative(Hz(Math.Sqrt(5.0)), m.UpperGainMarginHz!.Value, 1e-9, "gain margin frequency");
        Assert.True(m.IsClosedLoopStable);
    }

    [Fact]
    public void Case06_round_off_pole_given_as_a_root_is_scrubbed()
    {
        // The same loop from roots in Bode form: K = 3/5 at the low-frequency asymptote K/s, poles {+1e-17, -1, -5}.
        var fromRoots = TransferFunction.FromRoots(0.6, 0, [], [new Complex(1e-17, 0), new Complex(-1, 0), new Complex(-5, 0)]);
        Assert.Equal(-1, fromRoots.OriginOrder);
        Assert.DoesNotContain(fromRoots.Poles, p => p.Real > 0);
        var m = MarginAnalyzer.Analyze(fromRoots, Hz(1e-3), Hz(1e3));
        Assert.Equal(0, m.OpenLoopRhpPoleCount);
        AssertClose(20.0, m.UpperGainMarginDb!.Value, 1e-9, "gain margin");
        Assert.True(m.IsClosedLoopStable);
    }

    [Fact]
    public void Case06_genuine_rhp_pole_is_reported_and_stability_comes_from_the_closed_loop_poles()
    {
        // T = 2 / (s - 1): one open-loop pole at +1. Closed loop s - 1 + 2 = s + 1: pole at -1, stable
        // (Nyquist: one counter-clockwise encirclement of -1 for one RHP pole).
        // |T| = 2 / sqrt(1 + w^2) = 1 at w = sqrt(3); phase = -180 + atan(w) = -120 there: PM = 60 degrees.
        var t = TransferFunction.FromCoefficients([2.0], [1.0, -1.0]);
        var m = MarginAnalyzer.Analyze(t, Hz(1e-3), Hz(1e3));
        Assert.Equal(1, m.OpenLoopRhpPoleCount);
        Assert.Contains(m.Notes, n => n.Contains("right half plane"));
        Assert.True(m.IsClosedLoopStable);
        var p = Assert.Single(m.ClosedLoopPoles);
        AssertClose(-1.0, p.Real, 1e-12, "closed-loop pole");
        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(Hz(Math.Sqrt(3.0)), c.FrequencyHz, 1e-9, "gain crossover");
        AssertClose(60.0, c.PhaseMarginDeg, 1e-8, "phase margin");
    }

    [Fact]
    public void Case06_rhp_pole_with_no_crossing_is_still_unstable()
    {
        // T = 0.5 / (s - 1): |T| <= 0.5, so there is no crossing at all and margins alone would read as "infinite";
        // the closed loop s - 1 + 0.5 has its pole at +0.5: unstable.
        var t = TransferFunction.FromCoefficients([0.5], [1.0, -1.0]);
        var m = MarginAnalyzer.Analyze(t, Hz(1e-3), Hz(1e3));
        Assert.Empty(m.GainCrossovers);
        Assert.Equal(1, m.OpenLoopRhpPoleCount);
        Assert.False(m.IsClosedLoopStable);
        var p = Assert.Single(m.ClosedLoopPoles);
        AssertClose(0.5, p.Real, 1e-12, "closed-loop pole");
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 7: right-half-plane zeros.
    // ---------------------------------------------------------------------------------------------------------

    [Fact]
    public void Case07_rhp_zero_adds_lag_so_the_phase_falls()
    {
        // arg(1 - j w/wz) = -atan(w/wz): -45 degrees at wz, towards -90 above; magnitude as for a LHP zero (+3.01 dB).
        var rhp = TransferFunction.FromFactors(1.0, 0, [Factor.Real(1000.0, rightHalfPlane: true)], []);
        var lhp = TransferFunction.FromFactors(1.0, 0, [Factor.Real(1000.0)], []);
        var fromPolynomial = TransferFunction.FromCoefficients([-1.0 / (TwoPi * 1000.0), 1.0], [1.0]);
        AssertClose(-45.0, rhp.PhaseDeg(1000.0), 1e-9, "RHP zero phase at its corner");
        AssertClose(45.0, lhp.PhaseDeg(1000.0), 1e-9, "LHP zero phase at its corner");
        AssertClose(-45.0, fromPolynomial.PhaseDeg(1000.0), 1e-9, "RHP zero from coefficients");
        AssertClose(10 * Math.Log10(2.0), rhp.MagnitudeDb(1000.0), 1e-9, "RHP zero magnitude");
        double previous = 0.0;
        foreach (double f in new[] { 10.0, 100.0, 1e3, 1e4, 1e5, 1e6 })
        {
            double p = rhp.PhaseDeg(f);
            Assert.True(p < previous, $"phase must fall: {p} at {f} Hz after {previous}");
            AssertClose(-Math.Atan(f / 1000.0) * Deg, p, 1e-9, $"RHP zero phase at {f} Hz");
            previous = p;
        }
    }

    [Theory]
    [InlineData(2000.0, true)]
    [InlineData(22000.0, false)]
    public void Case07_rhp_zero_limits_the_gain(double kHz, bool stable)
    {
        // T = K (1 - s/wz) / (s (1 + s/wp)): phase -90 - atan(w/wz) - atan(w/wp) = -180 at w^2 = wz wp. There
        // sqrt(1 + w^2/wz^2) / sqrt(1 + w^2/wp^2) = sqrt(wp/wz), so |T| = K sqrt(wp/wz) / sqrt(wz wp) = K / wz and
        // GM = 20 log10(wz / K). Closed loop s^2/wp + s (1 - K/wz) + K: stable iff K < wz, the same boundary.
        // wz = 2 pi 20 kHz, wp = 2 pi 5 kHz: phase crossover at sqrt(20 * 5) = 10 kHz.
        double k = TwoPi * kHz, wz = TwoPi * 20000.0;
        var t = TransferFunction.FromFactors(k, -1, [Factor.Real(20000.0, rightHalfPlane: true)], [Factor.Real(5000.0)]);
        var m = MarginAnalyzer.Analyze(t, 1.0, 1e7);
        var p = Assert.Single(m.PhaseCrossovers);
        AssertRelative(10000.0, p.FrequencyHz, 1e-9, "phase crossover");
        AssertClose(Db(wz / k), p.GainMarginDb, 1e-9, "gain margin");
        Assert.Equal(stable, m.IsClosedLoopStable);
        Assert.Equal(0, m.OpenLoopRhpPoleCount);
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 8: zeros on the imaginary axis.
    // ---------------------------------------------------------------------------------------------------------

    /// <summary>T = 0.01 (s^2 + 100) / (s (s + 1)^2) = (1 + s^2/100) / (s (1 + s)^2): a notch at w0 = 10 rad/s.</summary>
    private static IEnumerable<TransferFunction> NotchLoops()
    {
        yield return TransferFunction.FromCoefficients([0.01, 0.0, 1.0], [1.0, 2.0, 1.0, 0.0]);
        yield return TransferFunction.FromRoots(1.0, -1, [new Complex(0, 10), new Complex(0, -10)], [new Complex(-1, 0), new Complex(-1, 0)]);
    }

    [Fact]
    public void Case08_notch_makes_the_phase_jump_by_180_degrees_at_w0()
    {
        // Below w0: phase -90 - 2 atan(w) (notch factor 1 - w^2/100 > 0); above: the factor turns negative and
        // adds +180 (limit from the left half plane, shared/CONVENTIONS.md). At w0 = 10: -258.58 -> -78.58.
        foreach (var t in NotchLoops())
        {
            Assert.Equal([10.0], t.AxisRootFrequencies().Select(w => Math.Round(w, 9)));
            double below = t.PhaseDeg(Hz(10.0 * (1 - 1e-9))), above = t.PhaseDeg(Hz(10.0 * (1 + 1e-9)));
            AssertClose(-90.0 - (2 * Math.Atan(10.0) * Deg), below, 1e-6, "phase just below the notch");
            AssertClose(180.0, above - below, 1e-6, "jump at the notch");
            // No jump anywhere else: away from w0 the phase moves smoothly.
            var response = FrequencyResponse.Of(t, new FrequencyGrid(Hz(0.01), Hz(1000.0), 3000));
            for (int i = 1; i < response.Count; i++)
            {
                bool straddlesNotch = TwoPi * response.FrequencyHz[i - 1] < 10.0 && TwoPi * response.FrequencyHz[i] > 10.0;
                double step = Math.Abs(response.PhaseDeg[i] - response.PhaseDeg[i - 1]);
                Assert.True(straddlesNotch ? Math.Abs(step - 180.0) < 1.0 : step < 1.0, $"phase step {step} at {response.FrequencyHz[i]} Hz");
            }
        }
    }

    [Fact]
    public void Case08_notch_jump_does_not_fake_a_phase_crossover()
    {
        // The jump from -258.58 to -78.58 degrees passes -180 without the phase taking that value: no crossover.
        // The genuine one: -90 - 2 atan(w) = -180 at w = 1 rad/s, where |T| = 0.01 * 99 / (1 * 2) = 0.495,
        // GM = -20 log10(0.495) = 6.107 dB. Above w0 the phase stays in (-90, -78.58): nothing more.
        // Gain crossover below w0: 0.01 (100 - w^2) = w (1 + w^2), i.e. w^3 + 0.01 w^2 + w - 1 = 0; above w0,
        // 0.01 (w^2 - 100) = w (1 + w^2) has no positive root (w^3 - 0.01 w^2 + w + 1 > 0).
        foreach (var t in NotchLoops())
        {
            var m = MarginAnalyzer.Analyze(t, Hz(1e-3), Hz(1e4));
            var p = Assert.Single(m.PhaseCrossovers);
            AssertRelative(Hz(1.0), p.FrequencyHz, 1e-9, "genuine phase crossover");
            AssertClose(-Db(0.495), p.GainMarginDb, 1e-9, "gain margin");
            var c = Assert.Single(m.GainCrossovers);
            double w = TwoPi * c.FrequencyHz;
            AssertClose(0.0, (w * w * w) + (0.01 * w * w) + w - 1.0, 1e-9, "crossover solves the cubic");
            Assert.True(m.IsClosedLoopStable);
        }
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 9: pure delay.
    // ---------------------------------------------------------------------------------------------------------

    private const double DelayTd = 10e-6;

    /// <summary>T = (w_c / s) e^(-s Td), w_c = 2 pi 1 kHz, Td = 10 us.</summary>
    private static TransferFunction DelayedIntegrator(double delayS = DelayTd) => TransferFunction.FromFactors(TwoPi * 1000.0, -1, [], [], delayS);

    [Fact]
    public void Case09_delay_phase_falls_without_bound_and_is_exact_on_a_coarse_grid()
    {
        // Phase = -90 - 360 f Td degrees exactly; at 1 MHz: -90 - 3600.
        var t = DelayedIntegrator();
        var coarse = FrequencyResponse.Of(t, new FrequencyGrid(1.0, 1e7, 15));
        for (int i = 0; i < coarse.Count; i++)
        {
            double f = coarse.FrequencyHz[i];
            AssertClose(-90.0 - (360.0 * f * DelayTd), coarse.PhaseDeg[i], 1e-9 * Math.Max(1.0, 360.0 * f * DelayTd), $"phase at {f} Hz");
            AssertClose(Db(1000.0 / f), coarse.MagnitudeDb[i], 1e-9, $"magnitude at {f} Hz");
        }

        AssertClose(-3690.0, t.PhaseDeg(1e6), 1e-9, "phase at 1 MHz");
    }

    [Fact]
    public void Case09_every_delay_phase_crossing_is_found()
    {
        // -90 - 360 f Td = -180 - 360 k  =>  f_k = (k + 1/4) / Td = 25 kHz + k 100 kHz. Up to 10 MHz: k = 0..99,
        // i.e. 100 crossings, each with GM = 20 log10(f_k / 1 kHz). The gain crossover stays at 1 kHz (|e^(-jwTd)| = 1)
        // with PM = 90 - 360 * 1e3 * 1e-5 = 86.4 degrees.
        var m = MarginAnalyzer.Analyze(DelayedIntegrator(), 1.0, 1e7);
        Assert.Equal(100, m.PhaseCrossovers.Length);
        for (int k = 0; k < 100; k++)
        {
            double fk = (k + 0.25) / DelayTd;
            var p = m.PhaseCrossovers[k];
            AssertRelative(fk, p.FrequencyHz, 1e-9, $"phase crossover {k}");
            Assert.Equal(-180.0 - (360.0 * k), p.CriticalPhaseDeg);
            AssertClose(Db(fk / 1000.0), p.GainMarginDb, 1e-8, $"gain margin {k}");
        }

        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(1000.0, c.FrequencyHz, 1e-9, "gain crossover");
        AssertClose(86.4, c.PhaseMarginDeg, 1e-9, "phase margin");
        AssertClose(Db(25.0), m.UpperGainMarginDb!.Value, 1e-8, "upper gain margin at 25 kHz");
    }

    [Fact]
    public void Case09_delay_margin_is_the_extra_delay_that_uses_up_the_phase_margin()
    {
        // DM = PM[rad] / w_c = (86.4 / 360) / 1000 Hz = 240 us; adding it brings the phase margin to zero.
        var m = MarginAnalyzer.Analyze(DelayedIntegrator(), 1.0, 1e6);
        AssertRelative(86.4 / 360.0 / 1000.0, m.DelayMarginS!.Value, 1e-9, "delay margin");
        var atLimit = MarginAnalyzer.Analyze(DelayedIntegrator().WithDelay(m.DelayMarginS.Value), 1.0, 1e6);
        AssertClose(0.0, atLimit.PhaseMarginDeg!.Value, 1e-7, "phase margin with the delay margin added");
    }

    [Theory]
    [InlineData(0.9, true)]
    [InlineData(1.1, false)]
    public void Case09_closed_loop_stability_with_a_delay_uses_pade_and_matches_the_exact_limit(double fractionOfLimit, bool stable)
    {
        // (w_c / s) e^(-s Td) in unity feedback is stable iff w_c Td < pi/2 (Nyquist: the phase at the only gain
        // crossover w_c is -90 - w_c Td). The analyzer decides from the poles of a Pade approximation and says so.
        double td = fractionOfLimit * (Math.PI / 2) / (TwoPi * 1000.0);
        var m = MarginAnalyzer.Analyze(DelayedIntegrator(td), 1.0, 1e6);
        Assert.Equal(stable, m.IsClosedLoopStable);
        Assert.NotNull(m.ClosedLoopPadeOrder);
        Assert.Contains(m.Notes, n => n.Contains("Pade"));
    }

    [Fact]
    public void Case09_open_loop_step_with_a_delay_is_an_exact_shift()
    {
        // h = e^(-s Td) / (1 + s/a), a = 2 pi 1 kHz: y = 0 for t < Td, 1 - e^(-a (t - Td)) afterwards.
        double a = TwoPi * 1000.0;
        var h = TransferFunction.FromFactors(1.0, 0, [], [Factor.Real(1000.0)], DelayTd);
        var r = StepSimulator.Simulate(h, 2e-3, 2001);
        Assert.Equal(DelayTreatment.ExactShift, r.Delay);
        for (int k = 0; k < r.TimeS.Length; k++)
        {
            double t = r.TimeS[k];
            double expected = t < DelayTd ? 0.0 : 1.0 - Math.Exp(-a * (t - DelayTd));
            AssertClose(expected, r.Value[k], 1e-9, $"step at {t} s");
        }
    }

    [Fact]
    public void Case09_closed_loop_step_needs_pade_and_matches_the_exact_delay_response()
    {
        // Closing the loop around the exact delay is refused; with a Pade approximation (order 6) the step follows
        // the exact solution of y'(t) = w_c (1 - y(t - Td)), found by the method of steps:
        // y(t) = sum_{k>=1} (-1)^(k+1) (w_c (t - k Td))^k / k!, summed over t > k Td.
        var loop = DelayedIntegrator(100e-6);
        Assert.Throws<InvalidOperationException>(() => loop.Feedback(TransferFunction.Constant(1.0)));
        var closed = loop.WithPadeDelay(6).Feedback(TransferFunction.Constant(1.0));
        Assert.False(closed.HasDelay);
        var r = StepSimulator.Simulate(closed, 2e-3, 2001);
        double wc = TwoPi * 1000.0, td = 100e-6;
        double worstEarly = 0.0, worstLate = 0.0;
        for (int i = 0; i < r.TimeS.Length; i++)
        {
            double t = r.TimeS[i], exact = 0.0;
            for (int k = 1; t > k * td; k++)
            {
                double x = wc * (t - (k * td)), term = 1.0;
                for (int j = 1; j <= k; j++)
                {
                    term *= x / j;
                }

                exact += k % 2 == 1 ? term : -term;
            }

            double error = Math.Abs(r.Value[i] - exact);
            if (t < 3 * td)
            {
                worstEarly = Math.Max(worstEarly, error);
            }
            else
            {
                worstLate = Math.Max(worstLate, error);
            }
        }

        // A Pade approximant matches e^(-j w Td) only for w Td small, and a step holds every frequency: its
        // response leaks before Td (the exact one is zero there), which is the largest error. Once the step's
        // fast content has passed, the loop (w_c Td = 0.63 rad) sees the delay only below a few w_c, where an
        // order-6 approximant is accurate. Bounds set by us, no source: 0.03 of the final value up to 3 Td,
        // 1e-4 afterwards.
        Assert.True(worstEarly < 0.03, $"Pade closed-loop step deviates from the exact delay response by {worstEarly} before 3 Td");
        Assert.True(worstLate < 1e-4, $"Pade closed-loop step deviates from the exact delay response by {worstLate} after 3 Td");
        AssertClose(1.0, r.Metrics.FinalValue!.Value, 1e-12, "final value");
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 10: sign of a negative margin.
    // ---------------------------------------------------------------------------------------------------------

    [Fact]
    public void Case10_negative_phase_margin_of_a_triple_integrator_is_minus_90()
    {
        // 1/s^3: |T| = 1 at w = 1 rad/s, phase -270, PM = 180 - 270 = -90 (not +90). s^3 + 1 has roots with
        // positive real part (1/2 +- j sqrt(3)/2): unstable.
        var m = MarginAnalyzer.Analyze(TransferFunction.FromCoefficients([1.0], [1.0, 0.0, 0.0, 0.0]), Hz(1e-3), Hz(1e3));
        var c = Assert.Single(m.GainCrossovers);
        AssertRelative(Hz(1.0), c.FrequencyHz, 1e-9, "gain crossover");
        AssertClose(-90.0, m.PhaseMarginDeg!.Value, 1e-9, "phase margin");
        Assert.False(m.IsClosedLoopStable);
        Assert.Null(m.DelayMarginS);
    }

    [Fact]
    public void Case10_unstable_third_order_loop_keeps_negative_margins_negative()
    {
        // K / (s (s+1)(s+5)) with the crossover put at w = 3 rad/s: K = 3 sqrt(10) sqrt(34) = 55.32 > 30.
        // PM = 180 - 90 - atan(3) - atan(3/5) = -12.53 degrees; GM = 20 log10(30 / K) = -5.31 dB (case 3).
        double k = 3.0 * Math.Sqrt(10.0) * Math.Sqrt(34.0);
        double pm = 90.0 - (Math.Atan(3.0) * Deg) - (Math.Atan(0.6) * Deg);
        var m = MarginAnalyzer.Analyze(ThirdOrderType1(k), Hz(1e-3), Hz(1e3));
        Assert.True(pm < 0);
        AssertClose(pm, m.PhaseMarginDeg!.Value, 1e-8, "phase margin");
        AssertRelative(Hz(3.0), m.CrossoverHz!.Value, 1e-9, "crossover");
        AssertClose(Db(30.0 / k), m.LowerGainMarginDb!.Value, 1e-9, "gain margin, negative");
        Assert.Null(m.UpperGainMarginDb);
        Assert.False(m.IsClosedLoopStable);
        Assert.False(m.IsConditionallyStable);
    }

    [Theory]
    [InlineData(-200.0, -20.0)]
    [InlineData(-181.0, -1.0)]
    [InlineData(-179.0, 1.0)]
    [InlineData(-120.0, 60.0)]
    public void Case10_phase_margin_from_phase_keeps_its_sign(double phaseDeg, double expectedPmDeg)
        => AssertClose(expectedPmDeg, MarginAnalyzer.PhaseMarginFromPhase(phaseDeg), 1e-12, $"PM for phase {phaseDeg}");

    // ---------------------------------------------------------------------------------------------------------
    // Case 11: units.
    // ---------------------------------------------------------------------------------------------------------

    [Fact]
    public void Case11_factors_are_in_hz_and_roots_in_rad_per_s()
    {
        // A pole factor at 1 kHz is the root -2 pi 1000 rad/s; at 1 kHz (not 1000 rad/s) |H| = 1/sqrt2 = -3.0103 dB
        // (20 log10, not 10 log10) and the phase is -45 degrees = -pi/4 rad.
        var h = TransferFunction.FromFactors(1.0, 0, [], [Factor.Real(1000.0)]);
        AssertRelative(-TwoPi * 1000.0, Assert.Single(h.Poles).Real, 1e-12, "pole in rad/s");
        AssertClose(-10.0 * Math.Log10(2.0), h.MagnitudeDb(1000.0), 1e-12, "magnitude in dB at 1 kHz");
        AssertClose(Db(1.0 / Math.Sqrt(1.0 + (1.0 / (TwoPi * TwoPi)))), h.MagnitudeDb(1000.0 / TwoPi), 1e-12, "magnitude at 1000 rad/s");
        AssertClose(-45.0, h.PhaseDeg(1000.0), 1e-12, "phase in degrees");
        AssertClose(-Math.PI / 4, h.PhaseRad(TwoPi * 1000.0), 1e-14, "phase in radians at 2 pi 1000 rad/s");
        Assert.Equal(h.Evaluate(TwoPi * 1000.0), h.EvaluateHz(1000.0));
        AssertClose(20.0, TransferFunction.Constant(10.0).MagnitudeDb(1.0), 1e-12, "gain 10 in dB");
    }

    [Fact]
    public void Case11_margins_carry_their_units()
    {
        // 3 / (s (s+1)(s+5)): GM = 20 log10(10) = 20 dB (not 10 linear, not 10 dB by 10 log10), at sqrt(5) rad/s
        // = 0.35588 Hz (not 2.236). Integrator 2 pi 1 kHz / s: crossover 1000 Hz, PM 90 degrees = pi/2 rad,
        // delay margin (pi/2) / (2 pi 1000) = 250 us (degrees / (rad/s) would give 14.3 ms; rad / Hz 1.57 ms).
        var third = MarginAnalyzer.Analyze(ThirdOrderType1(3.0), Hz(1e-3), Hz(1e3));
        AssertClose(20.0, third.UpperGainMarginDb!.Value, 1e-9, "gain margin in dB");
        AssertRelative(Math.Sqrt(5.0) / TwoPi, third.UpperGainMarginHz!.Value, 1e-9, "phase crossover in Hz");
        var integrator = MarginAnalyzer.Analyze(IntegratorAt1kHz(), 1.0, 1e6);
        AssertRelative(1000.0, integrator.CrossoverHz!.Value, 1e-9, "crossover in Hz");
        AssertClose(90.0, integrator.PhaseMarginDeg!.Value, 1e-9, "phase margin in degrees");
        AssertRelative(2.5e-4, integrator.DelayMarginS!.Value, 1e-9, "delay margin in seconds");
    }

    [Fact]
    public void Case11_step_times_are_in_seconds()
    {
        // 1 / (1 + s/a), a = 2 pi 1 kHz: tau = 159.15 us, 10-90 % rise time tau ln 9 = 349.7 us; settling to 2 %:
        // tau ln 50 = 622.6 us. Linear interpolation between samples 100 ns apart errs by far less than 1e-5 relative.
        double tau = 1.0 / (TwoPi * 1000.0);
        var r = StepSimulator.Simulate(TransferFunction.FromFactors(1.0, 0, [], [Factor.Real(1000.0)]), 2e-3, 20001);
        AssertRelative(tau * Math.Log(9.0), r.Metrics.RiseTimeS!.Value, 1e-5, "rise time in seconds");
        AssertRelative(tau * Math.Log(50.0), r.Metrics.SettlingTimeS!.Value, 1e-5, "settling time in seconds");
        AssertClose(0.0, r.Metrics.OvershootPct!.Value, 1e-9, "overshoot in %");
    }

    // ---------------------------------------------------------------------------------------------------------
    // Case 12: magnitude touching 0 dB without crossing.
    // ---------------------------------------------------------------------------------------------------------

    private const double TouchQ = 2.0;
    private const double TouchF0Hz = 10e3;

    /// <summary>
    /// K / (s^2/w0^2 + s/(Q w0) + 1) with K = 1/Mp. For Q > 1/sqrt2 the peak of the second-order low-pass is
    /// Mp = Q / sqrt(1 - 1/(4 Q^2)) at w0 sqrt(1 - 1/(2 Q^2)) (textbook result, from memory; it follows from
    /// d|H|^2 / d(w^2) = 0); Q = 2: Mp = 8/sqrt15 at w0 sqrt(7/8).
    /// </summary>
    private static TransferFunction TouchingLoop(double scale) => TransferFunction.FromFactors(scale * Math.Sqrt(15.0) / 8.0, 0, [], [Factor.Pair(TouchF0Hz, TouchQ)]);

    [Fact]
    public void Case12_magnitude_touching_0_dB_is_a_touch_not_two_crossovers()
    {
        double fPeak = TouchF0Hz * Math.Sqrt(7.0 / 8.0);
        var m = MarginAnalyzer.Analyze(TouchingLoop(1.0), 10.0, 1e6);
        Assert.Empty(m.GainCrossovers);
        var touch = Assert.Single(m.Touches);
        AssertRelative(fPeak, touch.FrequencyHz, 1e-6, "touch frequency");
        // Phase at the peak: -atan2(sqrt(7/8)/Q, 1 - 7/8); PM = 180 + phase.
        double phase = -Math.Atan2(Math.Sqrt(7.0 / 8.0) / TouchQ, 1.0 / 8.0) * Deg;
        AssertClose(180.0 + phase, touch.PhaseMarginDeg, 1e-4, "phase margin at the touch");
        Assert.Contains(m.Notes, n => n.Contains("touches 0 dB"));
    }

    [Theory]
    [InlineData(1.001, 2)]
    [InlineData(0.999, 0)]
    public void Case12_just_above_is_two_crossovers_and_just_below_is_none(double scale, int crossings)
    {
        var m = MarginAnalyzer.Analyze(TouchingLoop(scale), 10.0, 1e6);
        Assert.Equal(crossings, m.GainCrossovers.Length);
        Assert.Empty(m.Touches);
    }

    // ---------------------------------------------------------------------------------------------------------
    // Invariants over a table of loops.
    // ---------------------------------------------------------------------------------------------------------

    public static TheoryData<string> InvariantLoops() => ["third order K=3", "third order K=55", "conditionally stable", "resonant integrator", "notch", "delay", "wide span", "rhp zero", "rhp pole"];

    private static (TransferFunction Loop, double StartHz, double StopHz) InvariantLoop(string name) => name switch
    {
        "third order K=3" => (ThirdOrderType1(3.0), Hz(1e-3), Hz(1e3)),
        "third order K=55" => (ThirdOrderType1(55.0), Hz(1e-3), Hz(1e3)),
        "conditionally stable" => (ConditionallyStableLoop(), Hz(1e-3), Hz(1e5)),
        "resonant integrator" => (TransferFunction.FromFactors(1.0, -1, [], [Factor.Pair(Hz(10.0), 50.0)]), Hz(0.01), Hz(1e3)),
        "notch" => (NotchLoops().First(), Hz(1e-3), Hz(1e4)),
        "delay" => (DelayedIntegrator(), 1.0, 1e6),
        "wide span" => (WideSpanLoop(), 1e-3, 1e12),
        "rhp zero" => (TransferFunction.FromFactors(TwoPi * 2000.0, -1, [Factor.Real(20000.0, rightHalfPlane: true)], [Factor.Real(5000.0)]), 1.0, 1e7),
        "rhp pole" => (TransferFunction.FromCoefficients([2.0], [1.0, -1.0]), Hz(1e-3), Hz(1e3)),
        _ => throw new ArgumentOutOfRangeException(nameof(name)),
    };

    [Theory]
    [MemberData(nameof(InvariantLoops))]
    public void Invariant_magnitude_is_one_at_every_gain_crossover(string name)
    {
        // Checked through EvaluateAt (product of factors at a complex s), a different path from the log-magnitude sum
        // the search uses.
        var (loop, start, stop) = InvariantLoop(name);
        var m = MarginAnalyzer.Analyze(loop, start, stop);
        Assert.NotEmpty(m.GainCrossovers);
        foreach (var c in m.GainCrossovers)
        {
            double mag = Complex.Abs(loop.EvaluateAt(new Complex(0, TwoPi * c.FrequencyHz)));
            AssertClose(1.0, mag, 1e-9, $"{name}: |T| at {c.FrequencyHz} Hz");
        }
    }

    [Theory]
    [MemberData(nameof(InvariantLoops))]
    public void Invariant_scaling_the_loop_by_k_moves_every_gain_margin_by_minus_20_log10_k(string name)
    {
        // The phase does not depend on a positive gain, so the phase crossovers stay put and |kT| = k |T| there.
        var (loop, start, stop) = InvariantLoop(name);
        var reference = MarginAnalyzer.Analyze(loop, start, stop);
        foreach (double k in new[] { 0.3, 2.0, 10.0 })
        {
            var scaled = MarginAnalyzer.Analyze(loop.Scale(k), start, stop);
            Assert.Equal(reference.PhaseCrossovers.Length, scaled.PhaseCrossovers.Length);
            for (int i = 0; i < reference.PhaseCrossovers.Length; i++)
            {
                AssertRelative(reference.PhaseCrossovers[i].FrequencyHz, scaled.PhaseCrossovers[i].FrequencyHz, 1e-9, $"{name}, k={k}: phase crossover {i}");
                AssertClose(reference.PhaseCrossovers[i].GainMarginDb - Db(k), scaled.PhaseCrossovers[i].GainMarginDb, 1e-9, $"{name}, k={k}: gain margin {i}");
            }
        }
    }

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(2)]
    public void Invariant_step_final_value_is_the_closed_loop_dc_gain(int which)
    {
        // Type 0: 10 / ((1 + s)(1 + s/10)) closes to DC gain 10/11; type 1 loops close to 1 (textbook).
        (TransferFunction Loop, double Dc) c = which switch
        {
            0 => (TransferFunction.FromFactors(10.0, 0, [], [Factor.Real(Hz(1.0)), Factor.Real(Hz(10.0))]), 10.0 / 11.0),
            1 => (ThirdOrderType1(3.0), 1.0),
            _ => (ConditionallyStableLoop(), 1.0),
        };
        var closed = c.Loop.Feedback(TransferFunction.Constant(1.0));
        AssertClose(c.Dc, closed.DcGain!.Value, 1e-12, "closed-loop DC gain");
        var r = StepSimulator.Simulate(closed, 200.0, 20001);
        AssertClose(c.Dc, r.Metrics.FinalValue!.Value, 1e-12, "final value");
        AssertClose(c.Dc, r.Value[^1], 1e-6, "last sample of the step");
    }
}
