using System.Numerics;
using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Plotly.Blazor.Traces.ScatterLib;
using MarkerSymbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The small marks of the loop-gain and step charts, drawn as one trace per panel (<see cref="ChartMarks"/>): every
/// marker, line and label the chart showed as separate traces, shapes and annotations is a point or text of that trace,
/// at the core's numbers. Expected values are the core's analysis of the demo design or the inputs of the test itself.
/// </summary>
public sealed class ChartMarksTests
{
    [Fact]
    public void Marks_are_separated_by_gaps_and_each_point_keeps_its_own_style()
    {
        var marks = new ChartMarks("m", "x", "y", new Line { Color = "#010203", Dash = "dash" });
        Assert.True(marks.Segment(1, 2, 1, 3, "line", "end", TextPositionEnum.TopLeft));
        Assert.Equal(3, marks.Point(5, 6, MarkerSymbol.Square, 10, "#abcdef", "dot", "label", TextPositionEnum.BottomRight));
        Assert.Null(marks.Point(double.NaN, 6, MarkerSymbol.Square, 10, "#abcdef", "nan"));
        Assert.False(marks.Segment(1, double.PositiveInfinity, 1, 3, "infinite"));

        var t = Parse(marks.ToTrace("%{hovertext}"));
        Assert.Equal([1.0, 1.0, null, 5.0], Numbers(t, "x"));
        Assert.Equal([2.0, 3.0, null, 6.0], Numbers(t, "y"));
        Assert.Equal(JsonValueKind.Null, t.GetProperty("x")[2].ValueKind); // the gap reaches Plotly as null
        Assert.False(t.GetProperty("connectgaps").GetBoolean());
        Assert.Equal("lines+markers+text", t.GetProperty("mode").GetString());
        Assert.Equal([0.0, 0.0, 0.0, 10.0], Numbers(t.GetProperty("marker"), "size").Select(v => v!.Value));
        Assert.Equal("square", t.GetProperty("marker").GetProperty("symbol")[3].GetString());
        Assert.Equal("#abcdef", t.GetProperty("marker").GetProperty("color")[3].GetString());
        Assert.Equal("#abcdef", t.GetProperty("marker").GetProperty("line").GetProperty("color")[3].GetString());
        Assert.Equal(1, t.GetProperty("marker").GetProperty("opacity").GetDouble()); // per-point sizes would make plotly.js draw them translucent
        // A drawn entry without a label carries a zero-width space (plotly.js would drop an empty one's text node for
        // good); only the gap, never drawn, is empty.
        Assert.Equal([ChartMarks.NoLabel, "end", "", "label"], Strings(t, "text"));
        Assert.Equal("top left", t.GetProperty("textposition")[1].GetString());
        Assert.Equal("bottom right", t.GetProperty("textposition")[3].GetString());
        Assert.Equal(["line", "line", "", "dot"], Strings(t, "hovertext"));
        Assert.Equal(1, marks.MarkerCount);

        // Without a hover template the trace skips hover altogether.
        Assert.Equal("skip", Parse(marks.ToTrace(null)).GetProperty("hoverinfo").GetString());
    }

    [Fact]
    public void The_loop_gain_chart_draws_its_marks_as_one_trace_per_panel_without_shapes_or_annotations()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);

        // Six response traces (magnitude and phase of loop, plant, compensator) and the two marks traces.
        Assert.Equal(8, figure.Data.Count);
        var (mag, phase) = Marks(figure);
        Assert.Equal("y", mag.GetProperty("yaxis").GetString());
        Assert.Equal("y2", phase.GetProperty("yaxis").GetString());
        Assert.Null(figure.Layout.Shapes);
        Assert.Null(figure.Layout.Annotations);

        // 0 dB is the magnitude axis's zero line.
        Assert.True(figure.Layout.YAxis[0].ZeroLine);
        Assert.Equal(ChartPalette.Ink, figure.Layout.YAxis[0].ZeroLineColor);
    }

    [Fact]
    public void The_magnitude_marks_carry_the_crossovers_gain_margins_and_every_pole_and_zero_at_the_core_frequencies()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);
        var (mag, _) = Marks(figure);
        var points = Points(mag);
        var margins = analysis.Margins!;
        var range = ((double)figure.Layout.YAxis[0].Range[0], (double)figure.Layout.YAxis[0].Range[1]);

        Assert.NotEmpty(margins.GainCrossovers);
        Assert.NotEmpty(margins.PhaseCrossovers);
        foreach (var g in margins.GainCrossovers)
        {
            AssertMarker(points, "crossover", g.FrequencyHz, 0, "circle", 10, ChartPalette.Margin);
            AssertVertical(mag, "crossover", g.FrequencyHz, range);
        }

        foreach (var p in margins.PhaseCrossovers)
        {
            var m = AssertMarker(points, "|T| at phase crossover", p.FrequencyHz, p.MagnitudeDb, "square", 10, ChartPalette.GainMargin);
            string gm = p.GainMarginDb.ToString("F1", System.Globalization.CultureInfo.InvariantCulture).Replace("-", "\u2212", StringComparison.Ordinal);
            Assert.Contains("GM <b>" + gm + " dB</b>", m.Text, StringComparison.Ordinal);
            Assert.Contains(EngineeringFormat.Format(p.FrequencyHz, "Hz"), m.Text, StringComparison.Ordinal);
            AssertVertical(mag, "phase crossover", p.FrequencyHz, range);
        }

        // Plant poles and zeros (upper half plane, inside the frequency range) on the plant's magnitude.
        var plant = analysis.Loop!.Plant;
        var a = analysis.Design.Analysis;
        double[] InRange(IEnumerable<Complex> roots) => [.. roots.Where(r => r.Imaginary >= 0).Select(BodeFigure.RootFrequencyHz).Where(f => f >= a.StartHz && f <= a.StopHz)];
        var plantZeros = InRange(plant.Zeros);
        var plantPoles = InRange(plant.Poles);
        Assert.NotEmpty(plantZeros);
        Assert.NotEmpty(plantPoles);
        Assert.Equal(plantZeros.Length, points.Count(q => q.Hover == "plant zero"));
        Assert.Equal(plantPoles.Length, points.Count(q => q.Hover == "plant pole"));
        foreach (double f in plantZeros)
        {
            AssertMarker(points, "plant zero", f, plant.MagnitudeDb(f), "circle-open", 12, ChartPalette.Plant);
        }

        foreach (double f in plantPoles)
        {
            AssertMarker(points, "plant pole", f, plant.MagnitudeDb(f), "x", 11, ChartPalette.Plant);
        }

        // Compensator poles and zeros where the core placed them, on the compensator's magnitude.
        var placement = analysis.ResolvedPlacement!;
        var gc = analysis.Loop.Compensator;
        Assert.Equal([placement.Zero1Hz!.Value, placement.Zero2Hz!.Value], points.Where(q => q.Hover == "compensator zero").Select(q => q.X));
        Assert.Equal([placement.Pole1Hz!.Value, placement.Pole2Hz!.Value], points.Where(q => q.Hover == "compensator pole").Select(q => q.X));
        foreach (double f in new[] { placement.Zero1Hz.Value, placement.Zero2Hz.Value })
        {
            AssertMarker(points, "compensator zero", f, gc.MagnitudeDb(f), "circle-open", 15, ChartPalette.Compensator);
        }

        foreach (double f in new[] { placement.Pole1Hz.Value, placement.Pole2Hz.Value })
        {
            AssertMarker(points, "compensator pole", f, gc.MagnitudeDb(f), "x", 15, ChartPalette.Compensator);
        }

        // Nothing else is drawn as a marker: every one is accounted for above.
        int expected = margins.GainCrossovers.Length + margins.PhaseCrossovers.Length + plantZeros.Length + plantPoles.Length + 4;
        Assert.Equal(expected, points.Count(q => q.Size > 0));
    }

    [Fact]
    public void The_phase_marks_carry_the_phase_margin_the_phase_crossovers_and_the_labelled_minus_180_degree_line()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);
        var (_, phase) = Marks(figure);
        var points = Points(phase);
        var margins = analysis.Margins!;
        var range = ((double)figure.Layout.YAxis[1].Range[0], (double)figure.Layout.YAxis[1].Range[1]);

        foreach (var g in margins.GainCrossovers)
        {
            var m = AssertMarker(points, "phase at crossover", g.FrequencyHz, g.PhaseDeg, "circle", 10, ChartPalette.Margin);
            Assert.Contains("PM " + g.PhaseMarginDeg.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + "°", m.Text, StringComparison.Ordinal);
            Assert.Contains("fc " + EngineeringFormat.Format(g.FrequencyHz, "Hz"), m.Text, StringComparison.Ordinal);
            AssertVertical(phase, "crossover", g.FrequencyHz, range);
        }

        foreach (var p in margins.PhaseCrossovers)
        {
            AssertMarker(points, "phase crossover", p.FrequencyHz, p.CriticalPhaseDeg, "square", 10, ChartPalette.GainMargin);
            AssertVertical(phase, "phase crossover", p.FrequencyHz, range);
        }

        // The -180 degree line spans the analysed frequency range and is labelled at its right end.
        var a = analysis.Design.Analysis;
        var line = points.Where(q => q.Hover == "\u2212180°").ToList();
        Assert.Equal(2, line.Count);
        Assert.Equal((a.StartHz, -180.0), (line[0].X, line[0].Y));
        Assert.Equal((a.StopHz, -180.0), (line[1].X, line[1].Y));
        Assert.Equal("\u2212180°", line[1].Text);
        Assert.Null(points[line[0].Index - 1].X); // starts after a gap
    }

    [Fact]
    public void Each_clickable_marker_maps_to_its_quantity_and_the_selected_one_is_ringed()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var placement = analysis.ResolvedPlacement!;
        var frequency = new Dictionary<PlacementTarget, double>
        {
            [PlacementTarget.Zero1] = placement.Zero1Hz!.Value,
            [PlacementTarget.Zero2] = placement.Zero2Hz!.Value,
            [PlacementTarget.Pole1] = placement.Pole1Hz!.Value,
            [PlacementTarget.Pole2] = placement.Pole2Hz!.Value,
        };

        var plain = BodeFigure.Build(analysis, new BodeTraces(), null);
        var (mag, _) = Marks(plain);
        var points = Points(mag);
        int magIndex = plain.Data.ToList().FindIndex(t => ((Plotly.Blazor.Traces.Scatter)t).Name == BodeFigure.MagnitudeMarksName);
        Assert.Equal(frequency.Keys.Order(), plain.Hits.Select(h => h.Target).Order());
        foreach (var hit in plain.Hits)
        {
            Assert.Equal(magIndex, hit.TraceIndex);
            Assert.Equal(frequency[hit.Target], points[hit.PointIndex].X);
            Assert.StartsWith("compensator ", points[hit.PointIndex].Hover, StringComparison.Ordinal);
            Assert.Equal(hit.Target, plain.TargetAt(hit.TraceIndex, hit.PointIndex));
        }

        Assert.DoesNotContain(points, q => q.Size == BodeFigure.SelectedRingSize);
        Assert.Null(plain.TargetAt(magIndex, 0)); // a crossover line's end is not clickable

        // Selected: a dark ring over the marker, drawn after it (on top), clickable like it.
        var selected = BodeFigure.Build(analysis, new BodeTraces(), PlacementTarget.Pole1);
        var sp = Points(Marks(selected).Mag);
        var ring = Assert.Single(sp, q => q.Size == BodeFigure.SelectedRingSize);
        var marker = sp[selected.Hits.First(h => h.Target == PlacementTarget.Pole1).PointIndex];
        Assert.Equal((marker.X, marker.Y), (ring.X, ring.Y));
        Assert.Equal((ChartPalette.Ink, "circle-open"), (ring.Color, ring.Symbol));
        Assert.True(ring.Index > marker.Index);
        Assert.Equal(PlacementTarget.Pole1, selected.TargetAt(magIndex, ring.Index));
    }

    [Fact]
    public void A_placement_design_has_a_clickable_gain_handle_on_the_compensator_at_its_integrator_frequency()
    {
        var form = DesignForm.FromDesign(TestDesigns.Demo);
        form.UsePlacement(TestDesigns.DemoAnalysis.ResolvedPlacement!);
        var analysis = DesignAnalyzer.Analyze(form.Build());
        var design = Assert.IsType<LoopShaper.Core.Compensators.CompensatorPlacement>(analysis.Design.Compensator);
        Assert.Equal(LoopShaper.Core.Compensators.GainSettingKind.IntegratorHz, design.Gain.Kind); // what taking over the resolved placement sets
        double db = analysis.Loop!.Compensator.MagnitudeDb(design.Gain.Value);

        var figure = BodeFigure.Build(analysis, new BodeTraces(), PlacementTarget.Gain);
        var points = Points(Marks(figure).Mag);
        var hit = Assert.Single(figure.Hits, h => h.Target == PlacementTarget.Gain && points[h.PointIndex].Size != BodeFigure.SelectedRingSize);
        var handle = points[hit.PointIndex];
        Assert.Equal((design.Gain.Value, "diamond", ChartPalette.Loop), (handle.X!.Value, handle.Symbol, handle.Color));
        Assert.Equal(db, handle.Y!.Value, 1e-9);
        var ring = Assert.Single(points, q => q.Size == BodeFigure.SelectedRingSize);
        Assert.Equal((handle.X, handle.Y), (ring.X, ring.Y));
    }

    [Fact]
    public void The_step_chart_marks_peak_settling_and_final_value_in_one_trace_per_panel()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = StepFigure.Build(analysis);

        // A response and its marks per panel; the only annotations left are the two panel titles.
        Assert.Equal(4, figure.Data.Count);
        Assert.Equal(2, figure.Layout.Annotations.Count);
        Assert.All(figure.Layout.Annotations, n => Assert.StartsWith("<b>", n.Text, StringComparison.Ordinal));

        foreach (var (step, index, axis) in new[] { (analysis.LoadStep!, 1, "y"), (analysis.ReferenceStep!, 3, "y2") })
        {
            var t = Parse(figure.Data[index]);
            Assert.Equal(axis, t.GetProperty("yaxis").GetString());
            Assert.Equal("skip", t.GetProperty("hoverinfo").GetString());
            var points = Points(t);
            var m = step.Metrics;

            var peak = Assert.Single(points, q => q.Size > 0);
            Assert.Equal((m.PeakTimeS, m.PeakDeviation, ChartPalette.Margin), (peak.X!.Value, peak.Y!.Value, peak.Color));

            // The marks skip hover, so the entries are told apart by where they are: the final value from the first to the
            // last simulated time, the settling time from the response's largest to its smallest value, then the peak.
            double ts = m.SettlingTimeS!.Value;
            var drawn = points.Where(q => q.X is not null).ToList();
            Assert.Equal(5, drawn.Count);
            Assert.Equal([step.TimeS[0], step.TimeS[^1], ts, ts, m.PeakTimeS], drawn.Select(q => q.X!.Value));
            Assert.Equal([m.FinalValue!.Value, m.FinalValue.Value, step.Value.Max(), step.Value.Min(), m.PeakDeviation], drawn.Select(q => q.Y!.Value));
            Assert.Equal("settled (2 %) " + EngineeringFormat.Format(ts, "s"), drawn[3].Text);
            Assert.Equal(7, points.Count); // three entries separated by two gaps
        }

        string overshoot = "overshoot " + analysis.ReferenceStep!.Metrics.OvershootPct!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + " %";
        Assert.Contains(overshoot, Points(Parse(figure.Data[3])).Select(q => q.Text));
        Assert.StartsWith("peak \u2212", Points(Parse(figure.Data[1])).Single(q => q.Size > 0).Text, StringComparison.Ordinal);
    }

    private static (JsonElement Mag, JsonElement Phase) Marks(ChartFigure figure)
    {
        var named = figure.Data.Cast<Plotly.Blazor.Traces.Scatter>().ToList();
        return (Parse(named.Single(t => t.Name == BodeFigure.MagnitudeMarksName)), Parse(named.Single(t => t.Name == BodeFigure.PhaseMarksName)));
    }

    private static JsonElement Parse(object trace) => JsonDocument.Parse(JsonSerializer.Serialize(trace)).RootElement;

    private static double?[] Numbers(JsonElement e, string name) => [.. e.GetProperty(name).EnumerateArray().Select(v => v.ValueKind == JsonValueKind.Null ? (double?)null : v.GetDouble())];

    private static string[] Strings(JsonElement e, string name) => [.. e.GetProperty(name).EnumerateArray().Select(v => v.GetString() ?? string.Empty)];

    private static List<Mark> Points(JsonElement t)
    {
        var x = Numbers(t, "x");
        var y = Numbers(t, "y");
        var marker = t.GetProperty("marker");
        var size = Numbers(marker, "size");
        var symbol = Strings(marker, "symbol");
        var color = Strings(marker, "color");
        var text = Strings(t, "text");
        var hover = t.GetProperty("hovertext").ValueKind == JsonValueKind.Array ? Strings(t, "hovertext") : null;
        return [.. Enumerable.Range(0, x.Length).Select(i => new Mark(i, x[i], y[i], size[i] ?? 0, symbol[i], color[i], text[i], hover?[i] ?? string.Empty))];
    }

    private static Mark AssertMarker(List<Mark> points, string hover, double x, double y, string symbol, int size, string color)
    {
        var m = Assert.Single(points, q => q.Hover == hover && q.Size > 0 && q.X is double qx && Math.Abs(qx - x) <= 1e-9 * x);
        Assert.Equal(y, m.Y!.Value, 1e-9);
        Assert.Equal((symbol, (double)size, color), (m.Symbol, m.Size, m.Color));
        Assert.True(m.Index == 0 || points[m.Index - 1].X is null, "a marker is separated from the entry before it by a gap");
        return m;
    }

    private static void AssertVertical(JsonElement trace, string hover, double hz, (double Min, double Max) range)
    {
        var points = Points(trace);
        var ends = points.Where(q => q.Hover == hover && q.Size == 0 && q.X is double x && Math.Abs(x - hz) <= 1e-9 * hz).ToList();
        Assert.Equal(2, ends.Count);
        Assert.Equal(ends[0].Index + 1, ends[1].Index);
        Assert.Equal((range.Min, range.Max), (ends[0].Y!.Value, ends[1].Y!.Value));
        Assert.True(ends[0].Index == 0 || points[ends[0].Index - 1].X is null, "a line is separated from the entry before it by a gap");
    }

    private sealed record Mark(int Index, double? X, double? Y, double Size, string Symbol, string Color, string Text, string Hover);
}
