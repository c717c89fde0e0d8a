using LoopShaper.Core.Corners;
using LoopShaper.Core.Design;

namespace LoopShaper.Cli.Tests;

public class CornerAndMonteCarloCommandTests
{
    [Fact]
    public async Task A_design_that_fails_only_at_one_corner_makes_analyze_exit_1()
    {
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json"))).Design!;
        var table = CornerSweep.Run(design, new CornerSweepOptions(IncludeResponses: false));
        // The phase-margin limit a hair above the worst corner's margin, every other criterion relaxed: exactly one corner fails.
        double worst = table.WorstPhaseMarginDeg!.Value;
        var main = DesignAnalyzer.Analyze(design).Margins!.PhaseMarginDeg!.Value;
        Assert.True(main > worst + 0.02, "the main operating point must pass");
        var strict = design with { Criteria = new DesignCriteria(MinPhaseMarginDeg: worst + 0.01, MinGainMarginDb: 0, MaxCrossoverFractionOfSwitching: 1, MinRippleFraction: 0, MaxRippleFraction: 10) };
        Assert.Single(CornerSweep.Run(strict, new CornerSweepOptions(IncludeResponses: false)).Failing);
        Assert.True(DesignAnalyzer.Analyze(strict).MeetsCriteria);
        using var file = new TempFile("strict.json", DesignFile.Write(strict));
        var run = await CliRun.Of("analyze", file.Path);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("Corner table (36 corners", run.Output, StringComparison.Ordinal);
        Assert.Contains("1 of 36 corners FAIL", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Montecarlo_prints_the_yield_and_percentiles_and_writes_every_sample()
    {
        using var csv = new TempFile("samples.csv");
        var run = await CliRun.Of("montecarlo", RepoFiles.Example("industrial-24v-to-5v.json"), "--samples", "200", "--seed", "9", "--out", csv.Path);
        Assert.InRange(run.ExitCode, 0, 1);
        Assert.Contains("yield: ", run.Output, StringComparison.Ordinal);
        Assert.Contains("phaseMarginDeg", run.Output, StringComparison.Ordinal);
        var lines = File.ReadAllLines(csv.Path);
        Assert.Equal(201, lines.Length);
        Assert.StartsWith("index,passed,crossoverHz,phaseMarginDeg", lines[0], StringComparison.Ordinal);
        var again = await CliRun.Of("montecarlo", RepoFiles.Example("industrial-24v-to-5v.json"), "--samples", "200", "--seed", "9");
        Assert.Equal(run.Output.Split('\n')[1], again.Output.Split('\n')[1]);
    }

    [Theory]
    [InlineData("0")]
    [InlineData("100001")]
    public async Task Montecarlo_rejects_a_sample_count_out_of_range(string n)
    {
        var run = await CliRun.Of("montecarlo", RepoFiles.Example("industrial-24v-to-5v.json"), "--samples", n);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--samples must be 1 to 100000", run.Error, StringComparison.Ordinal);
    }
}
