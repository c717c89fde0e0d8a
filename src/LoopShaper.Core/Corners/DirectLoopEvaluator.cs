using System.Collections.Immutable;
using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Numerics;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Core.Corners;

/// <summary>
/// The fast path of the Monte Carlo run: T(j omega) of a buck loop evaluated straight from the sampled parameters, with
/// no polynomial root finding, on a 1000-point log grid, and its margins by bracketing on the grid and Brent's method
/// on the same direct evaluation. The plant is the averaged model of <see cref="VoltageModeBuck"/>,
/// <see cref="PeakCurrentModeBuck"/> and <see cref="DcmBuck"/> in impedance form: with Y = 1/R + sum of the branch
/// admittances s C / (1 + s ESR C + s^2 ESL C) and Zs = Reff + s L, Gvd = Ad / (Zs Y + Gv) (Erickson and Maksimovic,
/// 2nd ed., sec. 8.2), and in peak current mode Gvc = Fm Ad / (Zs Y + Gv + Fm Ad (Ri He Y - kr)) (Ridley 1991; the same
/// algebra as <see cref="PeakCurrentModeBuck"/> divided by Dy). Closed-loop stability by the argument principle on
/// 1 + T along the imaginary axis (Nyquist; e.g. Franklin, Powell and Emami-Naeini, Feedback Control of Dynamic Systems,
/// sec. 6.3): with no open-loop pole in the right half plane and n integrators, the number of closed-loop right-half-plane
/// poles is Z = -(2 D - n pi) / (2 pi), D the change of arg(1 + T) from 0+ to infinity. A sample it cannot judge
/// (subharmonic current loop, gain still above 0 dB at the top of the range, Z not near an integer) returns null and
/// is analysed in full.
/// </summary>
public sealed class DirectLoopEvaluator
{
    /// <summary>Points of the evaluation grid.</summary>
    public const int GridPoints = 1000;

    private const double RootToleranceLnOmega = 1e-10;
    private readonly LoopDesign _design;
    private readonly ImmutableArray<ToleranceParameter> _parameters;
    private readonly OperatingCondition _at;
    private readonly double[] _omega;
    private readonly Complex[] _fixedCompensator;
    private readonly TransferFunctions.TransferFunction? _placement;
    private readonly double _startPhaseRad;
    private readonly double _limitArgRad;
    private readonly int _integrators;
    private readonly double[] _lm;
    private readonly double[] _ph;
    private Stage _s;

    /// <summary>An evaluator for a design (its crossover target resolved, <see cref="CornerSweep.Fixed"/>) at an operating condition. Not thread safe: one per thread.</summary>
    public DirectLoopEvaluator(LoopDesign design, ImmutableArray<ToleranceParameter> parameters, OperatingCondition? at)
    {
        if (!Supports(design))
        {
            throw new ArgumentException("The direct evaluator takes buck plants with a placement, op-amp or OTA compensator.", nameof(design));
        }

        _design = design;
        _parameters = parameters;
        var buck = (BuckPlant)design.Plant;
        _at = at ?? DesignAnalyzer.ConditionOf(buck.PowerStage, design.Analysis);
        var a = design.Analysis;
        _omega = [.. new FrequencyGrid(a.StartHz, a.StopHz, GridPoints).LogSpaced().Select(f => 2 * Math.PI * f)];
        _lm = new double[GridPoints];
        _ph = new double[GridPoints];
        _fixedCompensator = [];
        if (design.Compensator is CompensatorPlacement p)
        {
            _placement = p.TransferFunction();
            _fixedCompensator = [.. _omega.Select(_placement.Evaluate)];
        }

        // The continuous phase at the start of the range and the limit at 0+, from the full model of the nominal design.
        var nominal = ToleranceModel.Apply(design, parameters, ToleranceModel.Factors(parameters, ToleranceSet.Nominal));
        var t = DesignAnalyzer.BuildLoop(nominal, _at).Loop.LoopGain;
        _startPhaseRad = t.PhaseRad(_omega[0]);
        _integrators = Math.Max(-t.OriginOrder, 0);
        double tiny = _omega[0] * 1e-6;
        _limitArgRad = _integrators > 0 ? t.PhaseRad(tiny) : Complex.Add(1.0, t.Evaluate(tiny)).Phase;
    }

    /// <summary>True for the designs the evaluator handles: buck plants with a placement, op-amp network or OTA network.</summary>
    public static bool Supports(LoopDesign design)
        => design.Plant is BuckPlant && design.Compensator is CompensatorPlacement or OpAmpNetwork or TransconductanceNetwork
            && design.Compensator is not CompensatorPlacement { Gain.Kind: GainSettingKind.CrossoverHz };

    /// <summary>The figures of the design at these parameter factors; null when this evaluator cannot judge it (use the full analysis).</summary>
    public LoopFigures? Evaluate(IReadOnlyList<double> factors)
    {
        var d = ToleranceModel.Apply(_design, _parameters, factors);
        try
        {
            if (!Prepare(d))
            {
                return null;
            }
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            return null;
        }

        return Margins(d.Analysis.StartHz, d.Analysis.StopHz);
    }

    /// <summary>T(j omega) at one frequency for the prepared sample; <paramref name="k"/> the grid index or -1 off the grid.</summary>
    private Complex Loop(double w, int k)
    {
        var s = new Complex(0, w);
        ref readonly var st = ref _s;
        Complex y = st.LoadConductance;
        for (int b = 0; b < st.BranchC.Length; b++)
        {
            double c = st.BranchC[b];
            y += s * c / (1.0 + (s * (st.BranchEsr[b] * c)) + (s * s * (st.BranchEsl[b] * c)));
        }

        var zs = new Complex(st.Reff, w * st.L);
        Complex den = (zs * y) + st.Gv;
        if (st.CurrentMode)
        {
            Complex he = st.Dcm ? Complex.Zero : 1.0 + (s / (st.Wn * PeakCurrentModeBuck.SamplingZeroQ)) + (s * s / (st.Wn * st.Wn));
            den += st.Fm * st.Ad * ((st.Ri * he * y) - st.Kr);
        }

        Complex plant = st.Fm * st.Ad * st.Sense / den;
        if (st.DelayS > 0)
        {
            plant *= Complex.FromPolarCoordinates(1.0, -w * st.DelayS);
        }

        return plant * Compensator(s, k);
    }

    private Complex Compensator(Complex s, int k)
    {
        ref readonly var st = ref _s;
        switch (st.Kind)
        {
            case 0:
                return k >= 0 ? _fixedCompensator[k] : _placement!.Evaluate(s.Imaginary);
            case 1:
                {
                    Complex zf = st.Type == CompensatorType.TypeI ? 1.0 / (s * st.C1) : Parallel(st.R2 + (1.0 / (s * st.C1)), 1.0 / (s * st.C2));
                    Complex zin = st.Type == CompensatorType.TypeIII ? Parallel(st.R1, st.R3 + (1.0 / (s * st.C3))) : st.R1;
                    Complex ideal = zf / zin;
                    if (st.A0 <= 0)
                    {
                        return ideal;
                    }

                    Complex invA = (1.0 + (s / st.Wa)) * (st.W2 > 0 ? 1.0 + (s / st.W2) : Complex.One) / st.A0;
                    Complex load = st.Rb > 0 ? (1.0 / zin) + (1.0 / st.Rb) : 1.0 / zin;
                    return ideal / (1.0 + ((1.0 + (zf * load)) * invA));
                }

            default:
                {
                    Complex zn = st.Type == CompensatorType.TypeI ? 1.0 / (s * st.C1) : Parallel(st.R2 + (1.0 / (s * st.C1)), 1.0 / (s * st.C2));
                    return st.Gm * st.Ro * zn / (st.Ro + zn);
                }
        }
    }

    private static Complex Parallel(Complex a, Complex b) => a * b / (a + b);

    /// <summary>Solves the operating point and gathers the sample's model coefficients; false when the direct form does not apply.</summary>
    private bool Prepare(LoopDesign d)
    {
        var buck = (BuckPlant)d.Plant;
        var stage = buck.PowerStage;
        // The steady state as DesignAnalyzer.SolveOperatingPoint picks it, without its derivations.
        var (duty, veff, rs, vOn, vOff, _, physicalDcm) = BuckOperatingPoint.Balance(stage, _at);
        var choice = d.Analysis.ConductionModel;
        bool dcm = choice != ConductionModelChoice.Continuous && physicalDcm;
        if ((choice == ConductionModelChoice.Discontinuous && !dcm) || (dcm && !(_at.LoadCurrentA > 0)))
        {
            return false;
        }

        if (dcm)
        {
            duty = BuckOperatingPoint.DiscontinuousDutyCycle(stage, _at);
            (vOn, vOff) = (_at.InputVoltageV - stage.OutputVoltageV, stage.OutputVoltageV + stage.Rectifier.ForwardDropV);
        }

        double? loadOhm = _at.LoadCurrentA > 0 ? stage.OutputVoltageV / _at.LoadCurrentA : null;
        var model = dcm ? DcmBuck.Coefficients(stage, _at, duty) : new AveragedBuck(veff, duty, rs, 1.0);
        var st = new Stage
        {
            L = stage.Inductor.InductanceH,
            Reff = model.SeriesResistanceOhm,
            Gv = model.OutputGain,
            Ad = model.DutyGainV,
            Dcm = dcm,
            LoadConductance = loadOhm is double r ? 1.0 / r : 0.0,
            BranchC = [.. stage.OutputCapacitors.Select(b => b.TotalCapacitanceF)],
            BranchEsr = [.. stage.OutputCapacitors.Select(b => b.TotalEsrOhm)],
            BranchEsl = [.. stage.OutputCapacitors.Select(b => b.TotalEslH)],
            Sense = d.Compensator.TakesDividedOutput ? buck.Feedback.Ratio : 1.0,
        };
        double fs = stage.SwitchingFrequencyHz;
        switch (buck.Control)
        {
            case VoltageModeControl vm:
                st.Fm = 1.0 / vm.RampAt(_at.InputVoltageV);
                st.DelayS = vm.TotalDelayS(fs);
                break;
            case PeakCurrentModeControl pcm:
                double ts = 1.0 / fs, ri = pcm.SenseGainOhm, dd = duty;
                double sn = ri * vOn / st.L, sf = ri * vOff / st.L;
                if (!(sn > 0) || !(sf > 0))
                {
                    return false;
                }

                double mc = 1 + (pcm.Ramp.SlopeVPerS(sn, sf) / sn);
                if (!dcm && (mc * (1 - dd)) - 0.5 <= 0)
                {
                    return false;
                }

                st.CurrentMode = true;
                st.Fm = 1.0 / (mc * sn * ts);
                st.Ri = ri;
                st.Kr = dcm ? dd * ri * ts / st.L : ts * ri / (2 * st.L);
                st.Wn = Math.PI / ts;
                st.DelayS = pcm.TotalDelayS(fs);
                break;
            default:
                return false;
        }

        switch (d.Compensator)
        {
            case CompensatorPlacement:
                st.Kind = 0;
                break;
            case OpAmpNetwork n:
                st.Kind = 1;
                (st.Type, st.R1, st.R2, st.R3, st.C1, st.C2, st.C3) = (n.Type, n.R1Ohm, n.R2Ohm, n.R3Ohm, n.C1F, n.C2F, n.C3F);
                if (n.Amplifier is OpAmp amp)
                {
                    st.A0 = amp.OpenLoopGain;
                    st.Wa = 2 * Math.PI * amp.DominantPoleHz;
                    st.W2 = amp.SecondPoleHz is double f2 ? 2 * Math.PI * f2 : 0.0;
                    st.Rb = n.RBottomOhm > 0 ? n.RBottomOhm : buck.Feedback.BottomOhm;
                }

                break;
            case TransconductanceNetwork g:
                st.Kind = 2;
                (st.Type, st.R2, st.C1, st.C2, st.Gm, st.Ro) = (g.Type, g.R2Ohm, g.C1F, g.C2F, g.Amplifier.TransconductanceS, g.Amplifier.OutputResistanceOhm);
                break;
            default:
                return false;
        }

        _s = st;
        return true;
    }

    private LoopFigures? Margins(double startHz, double stopHz)
    {
        int n = _omega.Length;
        double prevArg = 0, argOnePlus = 0, startArgOnePlus = 0;
        for (int k = 0; k < n; k++)
        {
            double w = _omega[k];
            var t = Loop(w, k);
            double delay = w * _s.DelayS;
            // The rational part's phase, unwrapped along the grid; the delay's phase added exactly.
            var rational = _s.DelayS > 0 ? t * Complex.FromPolarCoordinates(1.0, delay) : t;
            double p = rational.Phase;
            if (k == 0)
            {
                p += 2 * Math.PI * Math.Round((_startPhaseRad + delay - p) / (2 * Math.PI));
            }
            else
            {
                p = prevArg + Wrap(p - prevArg);
            }

            prevArg = p;
            _ph[k] = p - delay;
            _lm[k] = Math.Log(t.Magnitude);
            double a1 = Complex.Add(1.0, t).Phase;
            if (k == 0)
            {
                // 1 + T follows T where |T| >> 1: take the branch of arg(1 + T) nearest the continuous phase of T.
                argOnePlus = _lm[0] > 0 ? a1 + (2 * Math.PI * Math.Round((_ph[0] - a1) / (2 * Math.PI))) : a1;
                startArgOnePlus = argOnePlus;
            }
            else
            {
                argOnePlus += Wrap(a1 - Wrap(argOnePlus));
            }
        }

        if (_lm[n - 1] >= 0)
        {
            return null;
        }

        // Argument principle: D = (arg at the start - limit at 0+) + change over the grid + (0 - principal arg at the top).
        double total = (startArgOnePlus - _limitArgRad) + (argOnePlus - startArgOnePlus) - Wrap(argOnePlus);
        double z = -((2 * total) - (_integrators * Math.PI)) / (2 * Math.PI);
        double zr = Math.Round(z);
        if (Math.Abs(z - zr) > 0.25)
        {
            return null;
        }

        bool stable = zr == 0;
        double? bestPm = null, bestFc = null, upper = null, lower = null;
        int crossings = 0;
        for (int k = 0; k + 1 < n; k++)
        {
            if ((_lm[k] > 0) != (_lm[k + 1] > 0))
            {
                double u = Root(k, LogMagnitude);
                double w = Math.Exp(u);
                double ph = PhaseNear(w, k);
                double pm = 180.0 + (ph * 180.0 / Math.PI);
                crossings++;
                if (bestPm is null || pm < bestPm)
                {
                    (bestPm, bestFc) = (pm, w / (2 * Math.PI));
                }
            }

            double l0 = Math.Floor((_ph[k] + Math.PI) / (2 * Math.PI)), l1 = Math.Floor((_ph[k + 1] + Math.PI) / (2 * Math.PI));
            if (l0 != l1)
            {
                double target = (Math.Max(l0, l1) * 2 * Math.PI) - Math.PI;
                int kk = k;
                double u = Root(k, x => PhaseNear(Math.Exp(x), kk) - target);
                double gm = -20.0 / Math.Log(10.0) * Math.Log(Loop(Math.Exp(u), -1).Magnitude);
                if (gm > 0 && (upper is null || gm < upper))
                {
                    upper = gm;
                }
                else if (gm < 0 && (lower is null || gm > lower))
                {
                    lower = gm;
                }
            }
        }

        _ = startHz;
        _ = stopHz;
        return new LoopFigures(bestFc, bestPm, upper, lower, crossings, stable);
    }

    private double LogMagnitude(double u) => Math.Log(Loop(Math.Exp(u), -1).Magnitude);

    /// <summary>The continuous phase at w between grid points k and k + 1: the branch nearest the grid's interpolated phase.</summary>
    private double PhaseNear(double w, int k)
    {
        double delay = w * _s.DelayS;
        var t = Loop(w, -1);
        double p = (_s.DelayS > 0 ? t * Complex.FromPolarCoordinates(1.0, delay) : t).Phase;
        double u0 = Math.Log(_omega[k]), u1 = Math.Log(_omega[k + 1]), u = Math.Log(w);
        double guess = _ph[k] + ((_ph[k + 1] - _ph[k]) * (u - u0) / (u1 - u0)) + delay;
        return p + (2 * Math.PI * Math.Round((guess - p) / (2 * Math.PI))) - delay;
    }

    private double Root(int k, Func<double, double> f)
    {
        double a = Math.Log(_omega[k]), b = Math.Log(_omega[k + 1]);
        return ScalarRootFinder.TryBrent(f, a, b, RootToleranceLnOmega, out double r) ? r : 0.5 * (a + b);
    }

    private static double Wrap(double x) => x - (2 * Math.PI * Math.Round(x / (2 * Math.PI)));

    /// <summary>The coefficients of one prepared sample.</summary>
    private struct Stage
    {
        public double L, Reff, Gv, Ad, Fm, Ri, Kr, Wn, DelayS, Sense, LoadConductance;
        public bool Dcm, CurrentMode;
        public double[] BranchC, BranchEsr, BranchEsl;
        public int Kind;
        public CompensatorType Type;
        public double R1, R2, R3, C1, C2, C3, A0, Wa, W2, Rb, Gm, Ro;
    }
}
