using System.CommandLine;
using System.Globalization;
using System.Text;
using LoopShaper.Core.Corners;

namespace LoopShaper.Cli;

/// <summary>`montecarlo FILE --samples N --seed S [--distribution uniform|normal] [--out FILE.csv]`: yield and percentiles over the tolerances.</summary>
internal static class MonteCarloCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var samples = new Option<int>("--samples", "-n") { Description = $"Number of samples, 1 to {MonteCarloSettings.MaxSamples}.", DefaultValueFactory = _ => 1000 };
        var seed = new Option<ulong>("--seed", "-s") { Description = "Seed: the same seed gives the same samples.", DefaultValueFactory = _ => 1UL };
        var distribution = new Option<string>("--distribution", "-d") { Description = "Distribution of every parameter within its tolerance: uniform, or normal with the tolerance as 3 sigma.", DefaultValueFactory = _ => "uniform" };
        distribution.AcceptOnlyFromAmong("uniform", "normal");
        var outFile = new Option<string?>("--out", "-o") { Description = "Write every sample (parameter values, figures, verdict) to this CSV file." };
        var command = new Command("montecarlo", "Draw the toleranced parameters (docs/design-file.md) N times, analyse each loop, print the yield against the criteria and the percentiles of crossover and margins. Exit code 0 when every sample meets the criteria, 1 when not, 2 for invalid input.")
        {
            file, samples, seed, distribution, outFile,
        };
        command.SetAction(parse =>
        {
            int n = parse.GetValue(samples);
            if (n < 1 || n > MonteCarloSettings.MaxSamples)
            {
                error.WriteLine($"error: --samples must be 1 to {MonteCarloSettings.MaxSamples}; got {n}.");
                return ExitCodes.InvalidInput;
            }

            var analysis = DesignLoader.Analyze(parse.GetValue(file)!, error);
            if (analysis is null)
            {
                return ExitCodes.InvalidInput;
            }

            string? csvPath = parse.GetValue(outFile);
            var settings = new MonteCarloSettings(n, parse.GetValue(seed), parse.GetValue(distribution) == "normal" ? SampleDistribution.Normal : SampleDistribution.Uniform, KeepAllSamples: csvPath is not null);
            var r = MonteCarloRunner.Run(analysis.Design, settings);
            output.Write(Text(r));
            if (csvPath is not null && !DesignLoader.Emit(Csv(r), csvPath, output, error))
            {
                return ExitCodes.InvalidInput;
            }

            return r.PassedCount == r.Completed ? ExitCodes.Success : ExitCodes.CriteriaNotMet;
        });
        return command;
    }

    /// <summary>The yield, the percentiles of each figure and the worst samples.</summary>
    public static string Text(MonteCarloResult r)
    {
        var inv = CultureInfo.InvariantCulture;
        var t = new StringBuilder();
        t.AppendLine(string.Create(inv, $"Monte Carlo: {r.Completed} samples, seed {r.Settings.Seed}, {r.Settings.Distribution.ToString().ToLowerInvariant()} within each tolerance, {r.Parameters.Length} parameters, {r.ElapsedS:F3} s"));
        t.AppendLine(string.Create(inv, $"yield: {r.YieldPct:F2} % ({r.PassedCount} of {r.Completed} samples meet every criterion)"));
        t.AppendLine();
        t.AppendLine(string.Create(inv, $"{"figure",-20} {"min",11} {"p1",11} {"p5",11} {"p50",11} {"p95",11} {"p99",11} {"max",11} {"missing",8}"));
        foreach (var d in r.Distributions)
        {
            t.AppendLine(string.Create(inv, $"{d.Figure,-20} {d.Min,11:G5} {d.P1,11:G5} {d.P5,11:G5} {d.P50,11:G5} {d.P95,11:G5} {d.P99,11:G5} {d.Max,11:G5} {d.MissingCount,8}"));
        }

        t.AppendLine();
        t.AppendLine("worst samples (index: phase margin, failures; parameter values):");
        foreach (var s in r.WorstSamples)
        {
            string pm = s.Figures?.PhaseMarginDeg is double p ? p.ToString("F2", inv) + " deg" : "none";
            t.AppendLine(string.Create(inv, $"  {s.Index}: PM {pm}; {(s.Passed ? "passes" : string.Join("; ", s.Failures))}"));
            t.AppendLine("    " + string.Join(", ", r.Parameters.Select((p, k) => string.Create(inv, $"{p.Name} = {s.Values[k]:G5}"))));
        }

        return t.ToString();
    }

    /// <summary>Every sample: index, verdict, figures, then one column per parameter value.</summary>
    public static string Csv(MonteCarloResult r)
    {
        var inv = CultureInfo.InvariantCulture;
        var t = new StringBuilder();
        t.Append("index,passed,crossoverHz,phaseMarginDeg,upperGainMarginDb,lowerGainMarginDb,closedLoopStable");
        foreach (var p in r.Parameters)
        {
            t.Append(',').Append('"').Append(p.Name.Replace("\"", "\"\"", StringComparison.Ordinal)).Append('"');
        }

        t.Append('\n');
        static string N(double? v) => v is double d ? d.ToString("R", CultureInfo.InvariantCulture) : string.Empty;
        foreach (var s in r.AllSamples)
        {
            t.Append(string.Create(inv, $"{s.Index},{(s.Passed ? "true" : "false")},{N(s.Figures?.CrossoverHz)},{N(s.Figures?.PhaseMarginDeg)},{N(s.Figures?.UpperGainMarginDb)},{N(s.Figures?.LowerGainMarginDb)},{(s.Figures is null ? string.Empty : s.Figures.IsClosedLoopStable ? "true" : "false")}"));
            foreach (double v in s.Values)
            {
                t.Append(',').Append(v.ToString("R", inv));
            }

            t.Append('\n');
        }

        return t.ToString();
    }
}
