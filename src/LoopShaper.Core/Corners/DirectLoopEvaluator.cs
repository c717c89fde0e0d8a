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
/// poles is Z = -(2 D - n pi) / (2 pi), D the change of arg(1 + T) from 0+ to infinity. Angles are unwrapped by counting
/// the grid intervals where T (phase crossings) or 1 + T (encirclements of -1) crosses the negative real axis, so the
/// grid loop needs no arctangent or logarithm; those are taken only at the crossings. A sample it cannot judge
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
    private readonly double[] _re;
    private readonly double[] _im;
    private readonly Complex[] _delay;
    private readonly double _delayS;
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
        _re = new double[GridPoints];
        _im = new double[GridPoints];
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
        _delayS = t.DelayS;
        _delay = [.. _omega.Select(w => Complex.FromPolarCoordinates(1.0, -w * _delayS))];
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
        ref readonly var st = ref _s;
        // Y = 1/R + sum of j w C / ((1 - w^2 ESL C) + j w ESR C).
        double yr = st.LoadConductance, yi = 0;
        for (int b = 0; b < st.BranchC.Length; b++)
        {
            double c = st.BranchC[b], wc = w * c;
            double dr = 1.0 - (w * wc * st.BranchEsl[b]), di = wc * st.BranchEsr[b];
            double inv = wc / ((dr * dr) + (di * di));
            yr += di * inv;
            yi += dr * inv;
        }

        var y = new Complex(yr, yi);
        var zs = new Complex(st.Reff, w * st.L);
        Complex den = (zs * y) + st.Gv;
        if (st.CurrentMode)
        {
            Complex he = st.Dcm ? Complex.Zero : new Complex(1.0 - (w * w / (st.Wn * st.Wn)), w / (st.Wn * PeakCurrentModeBuck.SamplingZeroQ));
            den += st.Fm * st.Ad * ((st.Ri * he * y) - st.Kr);
        }

        Complex plant = Div(st.Fm * st.Ad * st.Sense, den);
        if (st.DelayS > 0)
        {
            plant *= k >= 0 && st.DelayS == _delayS ? _delay[k] : Complex.FromPolarCoordinates(1.0, -w * st.DelayS);
        }

        return plant * Compensator(w, k);
    }

    /// <summary>a / b with one real division.</summary>
    private static Complex Div(Complex a, Complex b)
    {
        double inv = 1.0 / ((b.Real * b.Real) + (b.Imaginary * b.Imaginary));
        return new Complex(((a.Real * b.Real) + (a.Imaginary * b.Imaginary)) * inv, ((a.Imaginary * b.Real) - (a.Real * b.Imaginary)) * inv);
    }

    private Complex Compensator(double w, int k)
    {
        ref readonly var st = ref _s;
        var s = new Complex(0, w);
        switch (st.Kind)
        {
            case 0:
                return k >= 0 ? _fixedCompensator[k] : _placement!.Evaluate(w);
            case 1:
                {
                    // Zf = (1 + s R2 C1) / (s (C1 + C2) + s^2 R2 C1 C2) (Type II and III) or 1 / (s C1); Zin = R1 (1 + s R3 C3) / (1 + s (R1 + R3) C3) (Type III) or R1.
                    Complex nf = st.Type == CompensatorType.TypeI ? Complex.One : new Complex(1.0, w * st.R2 * st.C1);
                    Complex df = st.Type == CompensatorType.TypeI ? new Complex(0, w * st.C1) : new Complex(-w * w * st.R2 * st.C1 * st.C2, w * (st.C1 + st.C2));
                    Complex ni = st.Type == CompensatorType.TypeIII ? new Complex(st.R1, w * st.R1 * st.R3 * st.C3) : st.R1;
                    Complex di = st.Type == CompensatorType.TypeIII ? new Complex(1.0, w * (st.R1 + st.R3) * st.C3) : Complex.One;
                    Complex ideal = Div(nf * di, df * ni);
                    if (st.A0 <= 0)
                    {
                        return ideal;
                    }

                    Complex zf = Div(nf, df), zin = Div(ni, di);
                    Complex invA = (1.0 + (s / st.Wa)) * (st.W2 > 0 ? 1.0 + (s / st.W2) : Complex.One) / st.A0;
                    Complex load = st.Rb > 0 ? Div(di, ni) + (1.0 / st.Rb) : Div(di, ni);
                    return Div(ideal, 1.0 + ((1.0 + (zf * load)) * invA));
                }

            default:
                {
                    // gm (Ro || Zn) = gm Ro Nn / (Ro Dn + Nn).
                    Complex nn = st.Type == CompensatorType.TypeI ? Complex.One : new Complex(1.0, w * st.R2 * st.C1);
                    Complex dn = st.Type == CompensatorType.TypeI ? new Complex(0, w * st.C1) : new Complex(-w * w * st.R2 * st.C1 * st.C2, w * (st.C1 + st.C2));
                    return Div(st.Gm * st.Ro * nn, (st.Ro * dn) + nn);
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
        int cutsT = 0, cutsOnePlus = 0;
        Complex prev = Complex.Zero;
        for (int k = 0; k < n; k++)
        {
            var t = Loop(_omega[k], k);
            double m2 = (t.Real * t.Real) + (t.Imaginary * t.Imaginary);
            _lm[k] = m2 > 1 ? 1 : -1;
            if (k > 0)
            {
                // Crossings of the negative real axis by T (phase through -180 + k 360) and by 1 + T (T left of -1),
                // counted with their direction: the continuous angle grows by 2 pi when Im goes from + to -.
                if ((prev.Imaginary > 0) != (t.Imaginary > 0))
                {
                    double re0 = prev.Real + ((t.Real - prev.Real) * prev.Imaginary / (prev.Imaginary - t.Imaginary));
                    int dir = prev.Imaginary > 0 ? 1 : -1;
                    if (re0 < 0)
                    {
                        cutsT += dir;
                    }

                    if (re0 < -1)
                    {
                        cutsOnePlus += dir;
                    }
                }
            }

            _ph[k] = cutsT;
            _re[k] = t.Real;
            _im[k] = t.Imaginary;
            prev = t;
        }

        if (_lm[n - 1] > 0)
        {
            return null;
        }

        // The branch of the start: continuous phase of T nearest the full model's; arg(1 + T) follows it where |T| > 1.
        double p0 = Math.Atan2(_im[0], _re[0]);
        double branchT = Math.Round((_startPhaseRad - p0) / (2 * Math.PI));
        var one0 = new Complex(1.0 + _re[0], _im[0]);
        double a0 = one0.Phase;
        double m0 = _lm[0] > 0 ? Math.Round((p0 + (2 * Math.PI * branchT) - a0) / (2 * Math.PI)) : 0;

        // Argument principle: D = (arg(1 + T) at the start - its limit at 0+) + change over the grid + (0 - principal arg at the top)
        // = 2 pi (m0 + cuts) - limit (the principal parts cancel).
        double total = (2 * Math.PI * (m0 + cutsOnePlus)) - _limitArgRad;
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
            if (_lm[k] != _lm[k + 1])
            {
                double u = Root(k, LogMagnitude);
                double w = Math.Exp(u);
                var t = Loop(w, -1);
                // Continuous phase: principal angle on the branch of grid point k (its cut count and the start branch).
                double pk = Math.Atan2(_im[k], _re[k]) + (2 * Math.PI * (branchT + _ph[k]));
                double p = t.Phase;
                p += 2 * Math.PI * Math.Round((pk - p) / (2 * Math.PI));
                double pm = 180.0 + (p * 180.0 / Math.PI);
                crossings++;
                if (bestPm is null || pm < bestPm)
                {
                    (bestPm, bestFc) = (pm, w / (2 * Math.PI));
                }
            }

            if (_ph[k] != _ph[k + 1])
            {
                double u = Root(k, x =>
                {
                    var t = Loop(Math.Exp(x), -1);
                    return t.Imaginary / t.Magnitude;
                });
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

    private double Root(int k, Func<double, double> f)
    {
        double a = Math.Log(_omega[k]), b = Math.Log(_omega[k + 1]);
        return ScalarRootFinder.TryBrent(f, a, b, RootToleranceLnOmega, out double r) ? r : 0.5 * (a + b);
    }

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
