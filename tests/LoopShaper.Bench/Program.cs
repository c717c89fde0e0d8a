using System.Diagnostics;
using System.Globalization;
using System.Text.Json.Nodes;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;

// Benchmarks of the core on the example designs (a plain harness that prints figures; speed targets live here,
// not in timed tests). Usage: loopshaper-bench [--examples DIR] [--export FILE.json] [--corners-only]
string dir = ArgValue(args, "--examples") ?? FindExamples();
string? export = ArgValue(args, "--export");
var inv = CultureInfo.InvariantCulture;
var rows = new JsonArray();
Console.WriteLine($"LoopShaper core benchmark, {Environment.ProcessorCount} cores, .NET {Environment.Version}");
Console.WriteLine($"{"design",-40} {"resp+margins us",16} {"loop analysis us",17} {"whole design us",16}");
bool cornersOnly = args.Contains("--corners-only");
if (ArgValue(args, "--mc-export") is string mcExport)
{
    return MonteCarloLoops(Path.Combine(dir, ArgValue(args, "--design") ?? "core-rail-12v-to-1v0.json"), mcExport);
}

if (args.Contains("--profile"))
{
    var dz = DesignFile.Read(File.ReadAllText(Path.Combine(dir, "core-rail-12v-to-1v0.json"))).Design!;
    var ps = ToleranceModel.Parameters(dz);
    var atz = MonteCarloRunner.ConditionOf(dz, new MonteCarloSettings());
    var evz = new DirectLoopEvaluator(dz, ps, atz);
    var fz = ToleranceModel.Factors(ps, ToleranceSet.AllHigh);
    Console.WriteLine($"apply us {Time(() => ToleranceModel.Apply(dz, ps, fz).Name.Length):F1}");
    var dd = ToleranceModel.Apply(dz, ps, fz);
    var bp = (LoopShaper.Core.PlantModels.BuckPlant)dd.Plant;
    Console.WriteLine($"op point us {Time(() => (int)DesignAnalyzer.SolveOperatingPoint(bp.PowerStage, atz!, dd.Analysis.ConductionModel).DutyCycle):F1}");
    Console.WriteLine($"evaluate us {Time(() => evz.Evaluate(fz)!.CrossoverCount):F1}");
    Console.WriteLine($"factors us {Time(() => MonteCarloRunner.Factors(ps, new MonteCarloSettings(), 5).Length):F1}");
    return 0;
}

foreach (var file in Directory.GetFiles(dir, "*.json").Order(StringComparer.Ordinal).Where(_ => !cornersOnly))
{
    var read = DesignFile.Read(File.ReadAllText(file));
    if (read.Design is not LoopDesign design)
    {
        Console.WriteLine($"{Path.GetFileName(file),-40} unreadable: {string.Join("; ", read.Errors)}");
        continue;
    }

    var full = DesignAnalyzer.Analyze(design);
    if (!full.IsValid)
    {
        Console.WriteLine($"{Path.GetFileName(file),-40} invalid: {string.Join("; ", full.Issues)}");
        continue;
    }

    var loop = full.Loop!.LoopGain;
    var a = design.Analysis;
    var grid = new FrequencyGrid(a.StartHz, a.StopHz, 1000).LogSpaced();

    double respUs = Time(() =>
    {
        var r = FrequencyResponse.Of(loop, grid);
        var m = MarginAnalyzer.Analyze(loop, a.StartHz, a.StopHz);
        return r.Count + m.GainCrossovers.Length;
    });
    // Issue 2's "full analysis": operating point and loop, the 1000-point response, all margins and a
    // 2000-sample reference step.
    double loopUs = Time(() =>
    {
        var built = DesignAnalyzer.BuildLoop(design).Loop;
        var t = built.LoopGain;
        var r = FrequencyResponse.Of(t, grid);
        var m = MarginAnalyzer.Analyze(t, a.StartHz, a.StopHz);
        double fc = m.CrossoverHz ?? Math.Sqrt(a.StartHz * a.StopHz);
        var step = StepSimulator.Simulate(built.ReferenceToOutput(built.PadeOrder(fc)), 20 / fc, 2000);
        return r.Count + step.Value.Length;
    });

    // Everything DesignAnalyzer does for the workspace: the above plus plant and compensator responses, the load
    // step with slew, the corners, the ideal-amplifier comparison, criteria and derivations.
    var fullDesign = design with { Analysis = a with { Points = 1000, StepSamples = 2000 } };
    double fullUs = Time(() => DesignAnalyzer.Analyze(fullDesign).Criteria.Length);
    Console.WriteLine($"{Path.GetFileName(file),-40} {respUs,16:F1} {loopUs,17:F1} {fullUs,16:F1}");

    var zeros = new JsonArray([.. loop.AllZeros.Select(z => (JsonNode)new JsonArray(z.Real, z.Imaginary))]);
    var poles = new JsonArray([.. loop.AllPoles.Select(p => (JsonNode)new JsonArray(p.Real, p.Imaginary))]);
    rows.Add(new JsonObject
    {
        ["design"] = Path.GetFileName(file),
        ["gain"] = loop.Gain,
        ["originOrder"] = loop.OriginOrder,
        ["zerosRadPerS"] = zeros,
        ["polesRadPerS"] = poles,
        ["delayS"] = loop.DelayS,
        ["startHz"] = a.StartHz,
        ["stopHz"] = a.StopHz,
        ["responseAndMarginsUs"] = respUs,
        ["loopAnalysisUs"] = loopUs,
        ["wholeDesignUs"] = fullUs,
        ["crossoverHz"] = full.Margins!.CrossoverHz,
        ["phaseMarginDeg"] = full.Margins.PhaseMarginDeg,
    });
}

Console.WriteLine("targets (issue 2): response + margins <= 20 us, loop analysis (operating point, response, margins, step) <= 1000 us");

// Corners and Monte Carlo (issue: corners, tolerances and closed-loop performance).
Console.WriteLine();
Console.WriteLine($"{"design",-40} {"corners",8} {"table ms",9} {"MC 10k s",9} {"fast",6} {"yield %",8} {"max |dPM| deg",14}");
var mcRows = new JsonArray();
foreach (var file in Directory.GetFiles(dir, "*.json").Order(StringComparer.Ordinal))
{
    if (DesignFile.Read(File.ReadAllText(file)).Design is not LoopDesign design || !DesignAnalyzer.Analyze(design).IsValid)
    {
        continue;
    }

    CornerTable table = CornerSweep.Run(design);
    double tableMs = Time(() => CornerSweep.Run(design).Rows.Length) / 1000.0;
    var settings = new MonteCarloSettings(Samples: 10_000, Seed: 1);
    MonteCarloRunner.Run(design, settings with { Samples = 500 });
    var mc = MonteCarloRunner.Run(design, settings);
    double mcS = Enumerable.Range(0, 3).Min(_ => MonteCarloRunner.Run(design, settings).ElapsedS);

    // Agreement of the direct evaluator with the full analysis on 200 samples.
    double maxDiff = 0;
    var fixedDesign = CornerSweep.Fixed(design);
    var at = MonteCarloRunner.ConditionOf(fixedDesign, settings);
    if (DirectLoopEvaluator.Supports(fixedDesign))
    {
        var ev = new DirectLoopEvaluator(fixedDesign, mc.Parameters, at);
        for (int i = 0; i < 200; i++)
        {
            var f = MonteCarloRunner.Factors(mc.Parameters, settings, i);
            if (ev.Evaluate(f) is { PhaseMarginDeg: double a } && MonteCarloRunner.FullFigures(fixedDesign, mc.Parameters, f, at) is { PhaseMarginDeg: double b })
            {
                maxDiff = Math.Max(maxDiff, Math.Abs(a - b));
            }
        }
    }

    Console.WriteLine($"{Path.GetFileName(file),-40} {table.Rows.Length,8} {tableMs,9:F2} {mcS,9:F3} {mc.FastPathCount,6} {mc.YieldPct,8:F1} {maxDiff,14:G3}");
    mcRows.Add(new JsonObject { ["design"] = Path.GetFileName(file), ["corners"] = table.Rows.Length, ["cornerTableMs"] = tableMs, ["monteCarlo10kS"] = mcS, ["fastPathSamples"] = mc.FastPathCount });
}

Console.WriteLine("targets (corners issue): corner table (>= 27 corners) <= 20 ms; 10,000-sample Monte Carlo with full margins <= 0.2 s");
if (export is not null)
{
    File.WriteAllText(export, rows.ToJsonString(new System.Text.Json.JsonSerializerOptions { WriteIndented = true }));
    Console.WriteLine($"loops written to {export}");
}

return 0;

// The 10,000 loops of a Monte Carlo run (seed 1, uniform), each evaluated as the SciPy comparison does: the loop gain
// on 1000 log-spaced points and every margin. Times the core on those same loops, one thread and both cores, and writes
// the loops (zeros, poles, gain, delay) with the times to a JSON file for tests/LoopShaper.Bench/scipy_monte_carlo.py.
static int MonteCarloLoops(string file, string output)
{
    var design = CornerSweep.Fixed(DesignFile.Read(File.ReadAllText(file)).Design!);
    var settings = new MonteCarloSettings(Samples: 10_000, Seed: 1);
    var parameters = ToleranceModel.Parameters(design);
    var at = MonteCarloRunner.ConditionOf(design, settings);
    var loops = new LoopShaper.Core.TransferFunctions.TransferFunction[settings.Samples];
    for (int i = 0; i < loops.Length; i++)
    {
        var sample = ToleranceModel.Apply(design, parameters, MonteCarloRunner.Factors(parameters, settings, i));
        loops[i] = DesignAnalyzer.BuildLoop(sample, at).Loop.LoopGain;
    }

    var a = design.Analysis;
    var grid = new FrequencyGrid(a.StartHz, a.StopHz, 1000).LogSpaced();
    double[] pm = new double[loops.Length];
    void Evaluate(int i)
    {
        var r = FrequencyResponse.Of(loops[i], grid);
        var m = MarginAnalyzer.Analyze(loops[i], a.StartHz, a.StopHz);
        pm[i] = (m.PhaseMarginDeg ?? double.NaN) + (0 * r.Count);
    }

    for (int i = 0; i < 500; i++)
    {
        Evaluate(i); // tiered JIT warm-up
    }

    var sw = Stopwatch.StartNew();
    for (int i = 0; i < loops.Length; i++)
    {
        Evaluate(i);
    }

    double oneThreadS = sw.Elapsed.TotalSeconds;
    sw.Restart();
    Parallel.For(0, loops.Length, Evaluate);
    double bothCoresS = sw.Elapsed.TotalSeconds;
    Console.WriteLine($"{Path.GetFileName(file)}: 10,000 loop evaluations (1000 points + margins each): {oneThreadS:F3} s on one thread, {bothCoresS:F3} s on {Environment.ProcessorCount} cores");

    var json = new JsonObject
    {
        ["design"] = Path.GetFileName(file),
        ["startHz"] = a.StartHz,
        ["stopHz"] = a.StopHz,
        ["oneThreadS"] = oneThreadS,
        ["allCoresS"] = bothCoresS,
        ["cores"] = Environment.ProcessorCount,
        ["loops"] = new JsonArray([.. loops.Select((t, i) => (JsonNode)new JsonObject
        {
            ["gain"] = t.Gain,
            ["originOrder"] = t.OriginOrder,
            ["zerosRadPerS"] = new JsonArray([.. t.AllZeros.Select(z => (JsonNode)new JsonArray(z.Real, z.Imaginary))]),
            ["polesRadPerS"] = new JsonArray([.. t.AllPoles.Select(p => (JsonNode)new JsonArray(p.Real, p.Imaginary))]),
            ["delayS"] = t.DelayS,
            ["phaseMarginDeg"] = double.IsFinite(pm[i]) ? pm[i] : null,
        })]),
    };
    File.WriteAllText(output, json.ToJsonString());
    return 0;
}

static double Time(Func<int> work)
{
    int sink = 0;
    // Warm up (tiered JIT), then time enough repetitions for ~0.5 s, best of five rounds.
    var sw = Stopwatch.StartNew();
    while (sw.ElapsedMilliseconds < 300)
    {
        sink += work();
    }

    int reps = 1;
    sw.Restart();
    while (sw.ElapsedMilliseconds < 20)
    {
        sink += work();
        reps++;
    }

    reps = Math.Max(reps * 5, 5);
    double best = double.MaxValue;
    for (int round = 0; round < 5; round++)
    {
        sw.Restart();
        for (int i = 0; i < reps; i++)
        {
            sink += work();
        }

        best = Math.Min(best, sw.Elapsed.TotalMicroseconds / reps);
    }

    GC.KeepAlive(sink);
    return best;
}

static string? ArgValue(string[] args, string name)
{
    int i = Array.IndexOf(args, name);
    return i >= 0 && i + 1 < args.Length ? args[i + 1] : null;
}

static string FindExamples()
{
    var d = new DirectoryInfo(AppContext.BaseDirectory);
    while (d is not null && !Directory.Exists(Path.Combine(d.FullName, "docs", "examples")))
    {
        d = d.Parent;
    }

    return d is null ? "docs/examples" : Path.Combine(d.FullName, "docs", "examples");
}
