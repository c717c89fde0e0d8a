using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Core.Reporting;

namespace LoopShaper.Cli.Tests;

public class BodeCommandTests
{
    private const string Header = "frequency_hz,plant_mag_db,plant_phase_deg,compensator_mag_db,compensator_phase_deg,loop_mag_db,loop_phase_deg";

    [Theory]
    [MemberData(nameof(Examples))]
    public async Task Csv_has_the_header_and_finite_ascending_rows(string example)
    {
        var run = await CliRun.Of("bode", RepoFiles.Example(example));
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Error);
        var lines = run.Output.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(Header, lines[0]);
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example(example))).Design!;
        Assert.True(lines.Length - 1 >= design.Analysis.Points / 2, $"{lines.Length - 1} rows");
        double previous = 0;
        foreach (var line in lines.Skip(1))
        {
            var cells = line.Split(',');
            Assert.Equal(7, cells.Length);
            var v = cells.Select(c => double.Parse(c, NumberStyles.Float, CultureInfo.InvariantCulture)).ToArray();
            Assert.All(v, x => Assert.True(double.IsFinite(x), line));
            Assert.True(v[0] > previous, "frequencies ascend");
            previous = v[0];
        }

        var first = lines[1].Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray();
        var last = lines[^1].Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray();
        Assert.Equal(design.Analysis.StartHz, first[0], 1e-9 * design.Analysis.StartHz);
        Assert.Equal(design.Analysis.StopHz, last[0], 1e-9 * design.Analysis.StopHz);
    }

    [Fact]
    public async Task Loop_columns_are_the_sum_of_plant_and_compensator()
    {
        // T = Gc Fm Gvd with unit sense gain (LoopModel): magnitudes add in dB and phases add, row by row.
        var run = await CliRun.Of("bode", RepoFiles.Example("core-rail-12v-to-1v0.json"));
        foreach (var line in run.Output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Skip(1))
        {
            var v = line.Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray();
            Assert.Equal(v[1] + v[3], v[5], 1e-9);
            Assert.Equal(v[2] + v[4], v[6], 1e-9);
        }
    }

    [Fact]
    public void The_loop_magnitude_is_0_dB_at_the_reported_crossover()
    {
        // Invariant: |T| = 1 at the gain crossover (shared/STYLE.md, tests item 7), read off the table by interpolation in log f.
        var design = DesignFile.Read(File.ReadAllText(RepoFiles.Example("industrial-24v-to-5v.json"))).Design!;
        var analysis = DesignAnalyzer.Analyze(design);
        double fc = analysis.Margins!.CrossoverHz!.Value;
        var table = BodeTable.From(analysis)!;
        int i = table.FrequencyHz.ToList().FindIndex(f => f > fc);
        double u = Math.Log(fc / table.FrequencyHz[i - 1]) / Math.Log(table.FrequencyHz[i] / table.FrequencyHz[i - 1]);
        double db = table.Loop.MagnitudeDb[i - 1] + (u * (table.Loop.MagnitudeDb[i] - table.Loop.MagnitudeDb[i - 1]));
        Assert.Equal(0.0, db, 0.05);
    }

    [Fact]
    public async Task Out_writes_the_csv_to_a_file()
    {
        using var file = new TempFile("loop.csv");
        var run = await CliRun.Of("bode", RepoFiles.Example("usb-5v-to-3v3-diode.json"), "--out", file.Path);
        Assert.Equal(0, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.StartsWith(Header + "\n", File.ReadAllText(file.Path), StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_broken_file_exits_with_2()
    {
        using var file = new TempFile("broken.json", "{\"format\": \"loopshaper-design\", \"version\": 1, \"name\": \"x\"}");
        var run = await CliRun.Of("bode", file.Path);
        Assert.Equal(2, run.ExitCode);
        Assert.Equal(string.Empty, run.Output);
        Assert.Contains("error: $.plant: is required", run.Error, StringComparison.Ordinal);
        Assert.Contains("error: $.compensator: is required", run.Error, StringComparison.Ordinal);
    }

    public static TheoryData<string> Examples() => RepoFiles.Examples();
}
