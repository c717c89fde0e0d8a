using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Core.Units;

namespace LoopShaper.Library.Comparison;

/// <summary>The headline results of two analyses side by side: margins, crossover, step figures, operating point, verdict.</summary>
public static class ResultComparison
{
    /// <summary>Every headline figure of <paramref name="a"/> beside the same figure of <paramref name="b"/>; see <see cref="ResultFigure.Differs"/>.</summary>
    public static ImmutableArray<ResultFigure> Compare(DesignAnalysis a, DesignAnalysis b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        return
        [
            YesNo("meets its criteria", a.MeetsCriteria, b.MeetsCriteria),
            YesNo("closed loop stable", a.Margins?.IsClosedLoopStable, b.Margins?.IsClosedLoopStable),
            Figure("crossover frequency", "Hz", a.Margins?.CrossoverHz, b.Margins?.CrossoverHz),
            Figure("phase margin", "deg", a.Margins?.PhaseMarginDeg, b.Margins?.PhaseMarginDeg),
            Figure("gain margin", "dB", a.Margins?.UpperGainMarginDb, b.Margins?.UpperGainMarginDb),
            Figure("phase crossover frequency", "Hz", a.Margins?.UpperGainMarginHz, b.Margins?.UpperGainMarginHz),
            Figure("gain crossovers", string.Empty, a.Margins?.GainCrossovers.Length, b.Margins?.GainCrossovers.Length),
            Figure("reference-step overshoot", "%", a.ReferenceStep?.Metrics.OvershootPct, b.ReferenceStep?.Metrics.OvershootPct),
            Figure("reference-step settling time (2 %)", "s", a.ReferenceStep?.Metrics.SettlingTimeS, b.ReferenceStep?.Metrics.SettlingTimeS),
            Figure("load-step peak deviation", "V", a.LoadStep?.Metrics.PeakDeviation, b.LoadStep?.Metrics.PeakDeviation),
            Figure("load-step settling time (2 %)", "s", a.LoadStep?.Metrics.SettlingTimeS, b.LoadStep?.Metrics.SettlingTimeS),
            Figure("duty cycle", string.Empty, a.OperatingPoint?.DutyCycle, b.OperatingPoint?.DutyCycle),
            Figure("inductor ripple current (p-p)", "A", a.OperatingPoint?.RippleCurrentApp, b.OperatingPoint?.RippleCurrentApp),
            Figure("output ripple voltage (p-p)", "V", a.OperatingPoint?.OutputRippleVpp, b.OperatingPoint?.OutputRippleVpp),
        ];
    }

    private static ResultFigure Figure(string name, string unit, double? a, double? b) => new(name, unit, a, b, Text(a, unit), Text(b, unit));

    private static ResultFigure YesNo(string name, bool? a, bool? b) => new(name, string.Empty, a is bool x ? (x ? 1 : 0) : null, b is bool y ? (y ? 1 : 0) : null, Word(a), Word(b));

    private static string Word(bool? v) => v switch { true => "yes", false => "no", null => "none" };

    private static string Text(double? v, string unit) => v switch
    {
        null => "none",
        double x when unit == "deg" => x.ToString("F1", CultureInfo.InvariantCulture) + " deg",
        double x when unit == "dB" => x.ToString("F1", CultureInfo.InvariantCulture) + " dB",
        double x when unit == "%" => x.ToString("F1", CultureInfo.InvariantCulture) + " %",
        double x when unit.Length == 0 => x.ToString("G4", CultureInfo.InvariantCulture),
        double x => EngineeringFormat.Format(x, unit),
    };
}
