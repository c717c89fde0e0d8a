using System.Text.Json;
using LoopShaper.Core.Measurements;
using LoopShaper.Web.Components.Controls;
using LoopShaper.Web.Model.Charts;
using Microsoft.AspNetCore.Components.Forms;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The measured-response card and the overlay on the loop chart, over the real core, in strict JS interop. The file is
/// docs/examples/measured/core-rail-loop-gain.csv, made by make_core_rail_loop_gain.py beside it from the demo
/// design's own loop gain with +1.0 dB and -3 degrees added: those two numbers are the expected difference.
/// </summary>
public sealed class MeasuredPanelTests : BunitContext
{
    private static readonly string MeasuredCsv = File.ReadAllText(Path.Combine(RepoRoot(), "docs", "examples", "measured", "core-rail-loop-gain.csv"));

    public MeasuredPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Strict;
    }

    [Fact]
    public void Uploading_a_measurement_imports_it_as_the_core_reads_it()
    {
        MeasuredSet? got = null;
        var cut = Render<MeasuredPanel>(p => p.Add(c => c.Analysis, TestDesigns.DemoAnalysis).Add(c => c.MeasuredChanged, (MeasuredSet? m) => got = m));
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText(MeasuredCsv, "core-rail-loop-gain.csv"));

        cut.WaitForAssertion(() => Assert.NotNull(got));
        var expected = MeasuredCsvReader.Read(MeasuredCsv).Response!;
        Assert.Equal(expected.Samples.FrequencyHz.ToArray(), got!.Response.Samples.FrequencyHz.ToArray());
        Assert.Equal(expected.Samples.PhaseDeg.ToArray(), got.Response.Samples.PhaseDeg.ToArray());
        Assert.Equal(MeasuredQuantity.LoopGain, got.Quantity);
        Assert.Equal("core-rail-loop-gain.csv", got.FileName);
        Assert.Equal(["Coherence"], got.Response.IgnoredColumns);
        Assert.Empty(cut.FindAll("[data-measured-errors]"));
    }

    [Fact]
    public void A_malformed_file_lists_its_errors_by_line_and_imports_nothing()
    {
        bool raised = false;
        var cut = Render<MeasuredPanel>(p => p.Add(c => c.Analysis, TestDesigns.DemoAnalysis).Add(c => c.MeasuredChanged, (MeasuredSet? _) => raised = true));
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("Frequency (Hz),Gain (dB),Phase (deg)\n100,40,-90\n50,41,-91\n200,NaN,-95\n", "bad.csv"));

        cut.WaitForAssertion(() => Assert.Single(cut.FindAll("[data-measured-errors]")));
        Assert.False(raised);
        Assert.Equal(["3", "4"], cut.FindAll("[data-measured-error]").Select(e => e.GetAttribute("data-measured-error")!));
        Assert.Contains("line 3: frequency 50 Hz is not above 100 Hz on line 2", cut.Find("[data-measured-error='3']").TextContent, StringComparison.Ordinal);
        Assert.Contains("bad.csv", cut.Find("[data-measured-errors]").TextContent, StringComparison.Ordinal);
        Assert.Equal("empty", cut.Find("[data-measured-panel]").GetAttribute("data-measured-panel"));
    }

    [Fact]
    public void Measured_margins_stand_beside_the_model_and_the_difference_chart_shows_the_added_offsets()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var set = new MeasuredSet(MeasuredCsvReader.Read(MeasuredCsv).Response!, MeasuredQuantity.LoopGain, "core-rail-loop-gain.csv");
        var cut = Render<MeasuredPanel>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Measured, set));

        var expected = MeasurementComparison.Of(set.Response, set.Quantity, analysis.Loop!);
        Assert.Equal(expected.MeasuredMargins.PhaseMarginDeg!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + "°", cut.Find("[data-row='phase-margin'] [data-cell='measured']").TextContent);
        Assert.Equal(analysis.Margins!.PhaseMarginDeg!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + "°", cut.Find("[data-row='phase-margin'] [data-cell='model']").TextContent);
        // 3 degrees less phase and 1 dB more gain lower the phase margin: the measurement must show less than the model.
        Assert.True(expected.MeasuredMargins.PhaseMarginDeg < analysis.Margins.PhaseMarginDeg);

        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        var call = module.Invocations["newPlot"].Single();
        Assert.Equal("difference-chart", call.Arguments[0]);
        using var data = JsonDocument.Parse(JsonSerializer.Serialize(call.Arguments[1]));
        var traces = data.RootElement.EnumerateArray().ToList();
        var gain = traces.Single(t => t.GetProperty("name").GetString() == DifferenceFigure.GainName).GetProperty("y").EnumerateArray().Select(v => v.GetDouble()).ToList();
        var phase = traces.Single(t => t.GetProperty("name").GetString() == DifferenceFigure.PhaseName).GetProperty("y").EnumerateArray().Select(v => v.GetDouble()).ToList();
        // The file is written to 1e-4 dB and 1e-3 degrees (make_core_rail_loop_gain.py), the chart to 1e-3.
        Assert.All(gain, g => Assert.Equal(1.0, g, 2e-3));
        Assert.All(phase, d => Assert.Equal(-3.0, d, 2e-3));
    }

    [Fact]
    public void Choosing_plant_re_raises_the_measurement_as_a_plant()
    {
        MeasuredSet? got = null;
        var set = new MeasuredSet(MeasuredCsvReader.Read(MeasuredCsv).Response!, MeasuredQuantity.LoopGain, "m.csv");
        PlotlyModule.Setup(this);
        var cut = Render<MeasuredPanel>(p => p.Add(c => c.Analysis, TestDesigns.DemoAnalysis).Add(c => c.Measured, set).Add(c => c.MeasuredChanged, (MeasuredSet? m) => got = m));
        cut.Find("[data-measured-quantity]").Change(MeasuredQuantity.Plant.ToString());
        Assert.Equal(MeasuredQuantity.Plant, got!.Quantity);
        Assert.Same(set.Response, got.Response);
    }

    [Fact]
    public void Loop_chart_draws_the_measured_samples_over_the_model()
    {
        var module = PlotlyModule.Setup(this);
        var analysis = TestDesigns.DemoAnalysis;
        var set = new MeasuredSet(MeasuredCsvReader.Read(MeasuredCsv).Response!, MeasuredQuantity.LoopGain, "core-rail-loop-gain.csv");
        var cut = Render<BodeChart>(p => p.Add(c => c.Analysis, analysis).Add(c => c.Form, DesignForm.FromDesign(analysis.Design)).Add(c => c.Measured, set));

        cut.WaitForAssertion(() => Assert.Single(module.Invocations["newPlot"]));
        using var data = JsonDocument.Parse(JsonSerializer.Serialize(module.Invocations["newPlot"].Single().Arguments[1]));
        var measured = data.RootElement.EnumerateArray().Single(t => t.GetProperty("name").GetString() == MeasuredOverlay.MeasuredName + " T");
        var x = measured.GetProperty("x").EnumerateArray().Select(v => v.GetDouble()).ToList();
        var y = measured.GetProperty("y").EnumerateArray().Select(v => v.GetDouble()).ToList();
        // Every sample of the file, in Hz (the file is in kHz), at its measured gain.
        Assert.Equal(set.Response.Count, x.Count);
        Assert.Equal(10.0, x[0], 1e-6);
        Assert.Equal(69.0097, y[0], 1e-3);
        Assert.Contains("core-rail-loop-gain.csv", cut.Find("[data-measured-key]").TextContent, StringComparison.Ordinal);
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
