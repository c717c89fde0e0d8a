using System.Numerics;
using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Core.Units;
using LoopShaper.Web.Model.Charts;
using Plotly.Blazor.Traces.ScatterLib;
using MarkerSymbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum;

namespace LoopShaper.Web.Tests;

/// <summary>
/// The small marks of the loop-gain and step charts, drawn as three traces per panel (<see cref="ChartMarks"/>: line
/// segments, markers, labels): every marker, line and label the chart showed as separate traces, shapes and
/// annotations is a point of one of them, at the core's numbers. Expected values are the core's analysis of the demo
/// design or the inputs of the test itself.
/// </summary>
public sealed class ChartMarksTests
{
    [Fact]
    public void Segments_markers_and_labels_each_go_to_their_own_trace_and_each_point_keeps_its_own_style()
    {
        var marks = new ChartMarks("m", "x", "y", new Line { Color = "#010203", Dash = "dash" });
        Assert.True(marks.IsEmpty);
        Assert.True(marks.Segment(1, 2, 1, 3, "line", "end", TextPositionEnum.TopLeft));
        Assert.Equal(0, marks.Point(5, 6, MarkerSymbol.Square, 10, "#abcdef", "dot", "label", TextPositionEnum.BottomRight));
        Assert.Null(marks.Point(double.NaN, 6, MarkerSymbol.Square, 10, "#abcdef", "nan"));
        Assert.False(marks.Segment(1, double.PositiveInfinity, 1, 3, "infinite"));
        Assert.True(marks.Segment(7, 8, 9, 10, "second"));
        Assert.Equal(1, marks.Point(11, 12, MarkerSymbol.X, 12, "#123456", "cross"));
        Assert.False(marks.IsEmpty);

        var traces = marks.ToTraces("%{hovertext}").Select(Parse).ToList();
        Assert.Equal(["m lines", "m", "m labels"], traces.Select(t => t.GetProperty("name").GetString()));
        Assert.Equal("m", traces[ChartMarks.MarkersTrace].GetProperty("name").GetString());

        // Segments: one lines trace, separated by a gap that reaches Plotly as null and is never joined.
        var lines = traces[0];
        Assert.Equal("lines", lines.GetProperty("mode").GetString());
        Assert.Equal([1.0, 1.0, null, 7.0, 9.0], Numbers(lines, "x"));
        Assert.Equal([2.0, 3.0, null, 8.0, 10.0], Numbers(lines, "y"));
        Assert.Equal(JsonValueKind.Null, lines.GetProperty("x")[2].ValueKind);
        Assert.False(lines.GetProperty("connectgaps").GetBoolean());
        Assert.Equal("#010203", lines.GetProperty("line").GetProperty("color").GetString());
        Assert.Equal(["line", "line", "", "second", "second"], Strings(lines, "hovertext"));

        // Markers: their own symbol, size and colour per point, opaque, no gaps between them.
        var markers = traces[1];
        Assert.Equal("markers", markers.GetProperty("mode").GetString());
        Assert.Equal([5.0, 11.0], Numbers(markers, "x"));
        Assert.Equal([6.0, 12.0], Numbers(markers, "y"));
        Assert.Equal([10.0, 12.0], Numbers(markers.GetProperty("marker"), "size").Select(v => v!.Value));
        Assert.Equal(["square", "x"], Strings(markers.GetProperty("marker"), "symbol"));
        Assert.Equal(["#abcdef", "#123456"], Strings(markers.GetProperty("marker"), "color"));
        Assert.Equal(["#abcdef", "#123456"], Strings(markers.GetProperty("marker").GetProperty("line"), "color"));
        Assert.Equal(1, markers.GetProperty("marker").GetProperty("opacity").GetDouble()); // per-point sizes would make plotly.js draw them translucent
        Assert.Equal(["dot", "cross"], Strings(markers, "hovertext"));
        Assert.Equal(2, marks.MarkerCount);

        // Labels: only the labelled points, at the segment's end or beside the marker; never an empty text (plotly.js
        // would drop that text node for good), never hover.
        var labels = traces[2];
        Assert.Equal("text", labels.GetProperty("mode").GetString());
        Assert.Equal([1.0, 5.0], Numbers(labels, "x"));
        Assert.Equal([3.0, 6.0], Numbers(labels, "y"));
        Assert.Equal(["end", "label"], Strings(labels, "text"));
        Assert.Equal(["top left", "bottom right"], Strings(labels, "textposition"));
        Assert.Equal("skip", labels.GetProperty("hoverinfo").GetString());

        // Without a hover template the lines and markers skip hover too.
        Assert.All(marks.ToTraces(null).Select(Parse), t => Assert.Equal("skip", t.GetProperty("hoverinfo").GetString()));
    }

    [Fact]
    public void Empty_marks_still_give_their_three_traces_so_that_a_redraw_keeps_the_trace_indices()
    {
        var traces = new ChartMarks("m", "x", "y2", new Line()).ToTraces(null).Select(Parse).ToList();
        Assert.Equal(3, traces.Count);
        Assert.All(traces, t => Assert.Equal(0, t.GetProperty("x").GetArrayLength()));
        Assert.All(traces, t => Assert.Equal("y2", t.GetProperty("yaxis").GetString()));
    }

    [Fact]
    public void The_loop_gain_chart_draws_its_marks_as_three_traces_per_panel_without_shapes_or_annotations()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);

        // Six response traces (magnitude and phase of loop, plant, compensator), then the marks of each panel.
        Assert.Equal(12, figure.Data.Count);
        string[] marks = [.. new[] { BodeFigure.MagnitudeMarksName, BodeFigure.PhaseMarksName }.SelectMany(n => new[] { ChartMarks.LinesName(n), n, ChartMarks.LabelsName(n) })];
        Assert.Equal(marks, figure.Data.Skip(6).Cast<Plotly.Blazor.Traces.Scatter>().Select(t => t.Name));
        var (mag, phase) = Marks(figure);
        Assert.All(mag.Traces, t => Assert.Equal("y", t.GetProperty("yaxis").GetString()));
        Assert.All(phase.Traces, t => Assert.Equal("y2", t.GetProperty("yaxis").GetString()));
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
        var margins = analysis.Margins!;
        var range = ((double)figure.Layout.YAxis[0].Range[0], (double)figure.Layout.YAxis[0].Range[1]);

        Assert.NotEmpty(margins.GainCrossovers);
        Assert.NotEmpty(margins.PhaseCrossovers);
        foreach (var g in margins.GainCrossovers)
        {
            AssertMarker(mag.Markers, "crossover", g.FrequencyHz, 0, "circle", 10, ChartPalette.Margin);
            AssertVertical(mag.Lines, "crossover", g.FrequencyHz, range);
        }

        foreach (var p in margins.PhaseCrossovers)
        {
            var m = AssertMarker(mag.Markers, "|T| at phase crossover", p.FrequencyHz, p.MagnitudeDb, "square", 10, ChartPalette.GainMargin);
            string gm = p.GainMarginDb.ToString("F1", System.Globalization.CultureInfo.InvariantCulture).Replace("-", "\u2212", StringComparison.Ordinal);
            string label = LabelAt(mag.Labels, m);
            Assert.Contains("GM <b>" + gm + " dB</b>", label, StringComparison.Ordinal);
            Assert.Contains(EngineeringFormat.Format(p.FrequencyHz, "Hz"), label, StringComparison.Ordinal);
            AssertVertical(mag.Lines, "phase crossover", p.FrequencyHz, range);
        }

        // Plant poles and zeros (upper half plane, inside the frequency range) on the plant's magnitude.
        var plant = analysis.Loop!.Plant;
        var a = analysis.Design.Analysis;
        double[] InRange(IEnumerable<Complex> roots) => [.. roots.Where(r => r.Imaginary >= 0).Select(BodeFigure.RootFrequencyHz).Where(f => f >= a.StartHz && f <= a.StopHz)];
        var plantZeros = InRange(plant.Zeros);
        var plantPoles = InRange(plant.Poles);
        Assert.NotEmpty(plantZeros);
        Assert.NotEmpty(plantPoles);
        Assert.Equal(plantZeros.Length, mag.Markers.Count(q => q.Hover == "plant zero"));
        Assert.Equal(plantPoles.Length, mag.Markers.Count(q => q.Hover == "plant pole"));
        foreach (double f in plantZeros)
        {
            AssertMarker(mag.Markers, "plant zero", f, plant.MagnitudeDb(f), "circle-open", 12, ChartPalette.Plant);
        }

        foreach (double f in plantPoles)
        {
            AssertMarker(mag.Markers, "plant pole", f, plant.MagnitudeDb(f), "x", 11, ChartPalette.Plant);
        }

        // Compensator poles and zeros where the core placed them, on the compensator's magnitude.
        var placement = analysis.ResolvedPlacement!;
        var gc = analysis.Loop.Compensator;
        Assert.Equal([placement.Zero1Hz!.Value, placement.Zero2Hz!.Value], mag.Markers.Where(q => q.Hover == "compensator zero").Select(q => q.X));
        Assert.Equal([placement.Pole1Hz!.Value, placement.Pole2Hz!.Value], mag.Markers.Where(q => q.Hover == "compensator pole").Select(q => q.X));
        foreach (double f in new[] { placement.Zero1Hz.Value, placement.Zero2Hz.Value })
        {
            AssertMarker(mag.Markers, "compensator zero", f, gc.MagnitudeDb(f), "circle-open", 15, ChartPalette.Compensator);
        }

        foreach (double f in new[] { placement.Pole1Hz.Value, placement.Pole2Hz.Value })
        {
            AssertMarker(mag.Markers, "compensator pole", f, gc.MagnitudeDb(f), "x", 15, ChartPalette.Compensator);
        }

        // Nothing else is drawn as a marker, line or label: every one is accounted for above.
        int expected = margins.GainCrossovers.Length + margins.PhaseCrossovers.Length + plantZeros.Length + plantPoles.Length + 4;
        Assert.Equal(expected, mag.Markers.Count);
        Assert.Equal(3 * (margins.GainCrossovers.Length + margins.PhaseCrossovers.Length) - 1, mag.Lines.Count);
        Assert.Equal(margins.PhaseCrossovers.Length, mag.Labels.Count);
    }

    [Fact]
    public void The_phase_marks_carry_the_phase_margin_the_phase_crossovers_and_the_labelled_minus_180_degree_line()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = BodeFigure.Build(analysis, new BodeTraces(), null);
        var (_, phase) = Marks(figure);
        var margins = analysis.Margins!;
        var range = ((double)figure.Layout.YAxis[1].Range[0], (double)figure.Layout.YAxis[1].Range[1]);

        foreach (var g in margins.GainCrossovers)
        {
            var m = AssertMarker(phase.Markers, "phase at crossover", g.FrequencyHz, g.PhaseDeg, "circle", 10, ChartPalette.Margin);
            string label = LabelAt(phase.Labels, m);
            Assert.Contains("PM " + g.PhaseMarginDeg.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + "°", label, StringComparison.Ordinal);
            Assert.Contains("fc " + EngineeringFormat.Format(g.FrequencyHz, "Hz"), label, StringComparison.Ordinal);
            AssertVertical(phase.Lines, "crossover", g.FrequencyHz, range);
        }

        foreach (var p in margins.PhaseCrossovers)
        {
            AssertMarker(phase.Markers, "phase crossover", p.FrequencyHz, p.CriticalPhaseDeg, "square", 10, ChartPalette.GainMargin);
            AssertVertical(phase.Lines, "phase crossover", p.FrequencyHz, range);
        }

        // The -180 degree line spans the analysed frequency range and is labelled at its right end.
        var a = analysis.Design.Analysis;
        var line = phase.Lines.Where(q => q.Hover == "\u2212180°").ToList();
        Assert.Equal(2, line.Count);
        Assert.Equal((a.StartHz, -180.0), (line[0].X, line[0].Y));
        Assert.Equal((a.StopHz, -180.0), (line[1].X, line[1].Y));
        Assert.Null(phase.Lines[line[0].Index - 1].X); // starts after a gap
        Assert.Contains(phase.Labels, l => (l.X, l.Y, l.Text) == (a.StopHz, -180.0, "\u2212180°"));
        Assert.Equal(margins.GainCrossovers.Length + 1, phase.Labels.Count);
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
        var markers = Marks(plain).Mag.Markers;
        int magIndex = plain.Data.ToList().FindIndex(t => ((Plotly.Blazor.Traces.Scatter)t).Name == BodeFigure.MagnitudeMarksName);
        Assert.Equal(frequency.Keys.Order(), plain.Hits.Select(h => h.Target).Order());
        foreach (var hit in plain.Hits)
        {
            Assert.Equal(magIndex, hit.TraceIndex);
            Assert.Equal(frequency[hit.Target], markers[hit.PointIndex].X);
            Assert.StartsWith("compensator ", markers[hit.PointIndex].Hover, StringComparison.Ordinal);
            Assert.Equal(hit.Target, plain.TargetAt(hit.TraceIndex, hit.PointIndex));
        }

        Assert.DoesNotContain(markers, q => q.Size == BodeFigure.SelectedRingSize);
        Assert.Null(plain.TargetAt(magIndex - 1, 0)); // a crossover line's end is not clickable
        Assert.Null(plain.TargetAt(magIndex, markers.FindIndex(q => q.Hover == "plant pole"))); // nor is a plant pole

        // Selected: a dark ring over the marker, drawn after it (on top), clickable like it.
        var selected = BodeFigure.Build(analysis, new BodeTraces(), PlacementTarget.Pole1);
        var sp = Marks(selected).Mag.Markers;
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
        var markers = Marks(figure).Mag.Markers;
        var hit = Assert.Single(figure.Hits, h => h.Target == PlacementTarget.Gain && markers[h.PointIndex].Size != BodeFigure.SelectedRingSize);
        var handle = markers[hit.PointIndex];
        Assert.Equal((design.Gain.Value, "diamond", ChartPalette.Loop), (handle.X, handle.Symbol, handle.Color));
        Assert.Equal(db, handle.Y, 1e-9);
        var ring = Assert.Single(markers, q => q.Size == BodeFigure.SelectedRingSize);
        Assert.Equal((handle.X, handle.Y), (ring.X, ring.Y));
    }

    [Fact]
    public void The_step_chart_marks_peak_settling_and_final_value_in_three_traces_per_panel()
    {
        var analysis = TestDesigns.DemoAnalysis;
        var figure = StepFigure.Build(analysis);

        // A response and its marks per panel; the only annotations left are the two panel titles.
        Assert.Equal(8, figure.Data.Count);
        Assert.Equal(2, figure.Layout.Annotations.Count);
        Assert.All(figure.Layout.Annotations, n => Assert.StartsWith("<b>", n.Text, StringComparison.Ordinal));

        foreach (var (step, name, axis) in new[] { (analysis.LoadStep!, StepFigure.LoadMarksName, "y"), (analysis.ReferenceStep!, StepFigure.ReferenceMarksName, "y2") })
        {
            var marks = PanelOf(figure, name);
            Assert.All(marks.Traces, t => Assert.Equal(axis, t.GetProperty("yaxis").GetString()));
            Assert.All(marks.Traces, t => Assert.Equal("skip", t.GetProperty("hoverinfo").GetString()));
            var m = step.Metrics;

            var peak = Assert.Single(marks.Markers);
            Assert.Equal((m.PeakTimeS, m.PeakDeviation, ChartPalette.Margin), (peak.X, peak.Y, peak.Color));

            // The marks skip hover, so the line ends are told apart by where they are: the final value from the first
            // to the last simulated time, then (after a gap) the settling time from the response's largest to its
            // smallest value, labelled at its lower end.
            double ts = m.SettlingTimeS!.Value;
            Assert.Equal([step.TimeS[0], step.TimeS[^1], null, ts, ts], marks.Lines.Select(q => q.X));
            Assert.Equal([m.FinalValue!.Value, m.FinalValue.Value, null, step.Value.Max(), step.Value.Min()], marks.Lines.Select(q => q.Y));
            Assert.Contains(marks.Labels, l => (l.X, l.Y, l.Text) == (ts, step.Value.Min(), "settled (2 %) " + EngineeringFormat.Format(ts, "s")));
            Assert.Equal(2, marks.Labels.Count); // the settling time and the peak
        }

        string overshoot = "overshoot " + analysis.ReferenceStep!.Metrics.OvershootPct!.Value.ToString("F1", System.Globalization.CultureInfo.InvariantCulture) + " %";
        var reference = PanelOf(figure, StepFigure.ReferenceMarksName);
        Assert.Equal(overshoot, LabelAt(reference.Labels, reference.Markers.Single()));
        var load = PanelOf(figure, StepFigure.LoadMarksName);
        Assert.StartsWith("peak \u2212", LabelAt(load.Labels, load.Markers.Single()), StringComparison.Ordinal);
    }

    private static (Panel Mag, Panel Phase) Marks(ChartFigure figure) => (PanelOf(figure, BodeFigure.MagnitudeMarksName), PanelOf(figure, BodeFigure.PhaseMarksName));

    private static Panel PanelOf(ChartFigure figure, string name)
    {
        var named = figure.Data.Cast<Plotly.Blazor.Traces.Scatter>().ToList();
        JsonElement Trace(string n) => Parse(named.Single(t => t.Name == n));
        var lines = Trace(ChartMarks.LinesName(name));
        var markers = Trace(name);
        var labels = Trace(ChartMarks.LabelsName(name));
        return new Panel([lines, markers, labels], LinePoints(lines), MarkerPoints(markers), LabelPoints(labels));
    }

    private static JsonElement Parse(object trace) => JsonDocument.Parse(JsonSerializer.Serialize(trace)).RootElement;

    private static double?[] Numbers(JsonElement e, string name) => [.. e.GetProperty(name).EnumerateArray().Select(v => v.ValueKind == JsonValueKind.Null ? (double?)null : v.GetDouble())];

    private static string[] Strings(JsonElement e, string name) => [.. e.GetProperty(name).EnumerateArray().Select(v => v.GetString() ?? string.Empty)];

    private static string[]? Hover(JsonElement t) => t.TryGetProperty("hovertext", out var h) && h.ValueKind == JsonValueKind.Array ? Strings(t, "hovertext") : null;

    private static List<LinePoint> LinePoints(JsonElement t)
    {
        var x = Numbers(t, "x");
        var y = Numbers(t, "y");
        var hover = Hover(t);
        return [.. Enumerable.Range(0, x.Length).Select(i => new LinePoint(i, x[i], y[i], hover?[i] ?? string.Empty))];
    }

    private static List<Mark> MarkerPoints(JsonElement t)
    {
        var x = Numbers(t, "x");
        var y = Numbers(t, "y");
        var marker = t.GetProperty("marker");
        var size = Numbers(marker, "size");
        var symbol = Strings(marker, "symbol");
        var color = Strings(marker, "color");
        var hover = Hover(t);
        return [.. Enumerable.Range(0, x.Length).Select(i => new Mark(i, x[i]!.Value, y[i]!.Value, size[i] ?? 0, symbol[i], color[i], hover?[i] ?? string.Empty))];
    }

    private static List<Label> LabelPoints(JsonElement t)
    {
        var x = Numbers(t, "x");
        var y = Numbers(t, "y");
        var text = Strings(t, "text");
        Assert.DoesNotContain(string.Empty, text); // plotly.js drops an empty text's node for good
        return [.. Enumerable.Range(0, x.Length).Select(i => new Label(x[i]!.Value, y[i]!.Value, text[i]))];
    }

    private static string LabelAt(List<Label> labels, Mark m) => Assert.Single(labels, l => l.X == m.X && l.Y == m.Y).Text;

    private static Mark AssertMarker(List<Mark> markers, string hover, double x, double y, string symbol, int size, string color)
    {
        var m = Assert.Single(markers, q => q.Hover == hover && Math.Abs(q.X - x) <= 1e-9 * x);
        Assert.Equal(y, m.Y, 1e-9);
        Assert.Equal((symbol, (double)size, color), (m.Symbol, m.Size, m.Color));
        return m;
    }

    private static void AssertVertical(List<LinePoint> lines, string hover, double hz, (double Min, double Max) range)
    {
        var ends = lines.Where(q => q.Hover == hover && q.X is double x && Math.Abs(x - hz) <= 1e-9 * hz).ToList();
        Assert.Equal(2, ends.Count);
        Assert.Equal(ends[0].Index + 1, ends[1].Index);
        Assert.Equal((range.Min, range.Max), (ends[0].Y!.Value, ends[1].Y!.Value));
        Assert.True(ends[0].Index == 0 || lines[ends[0].Index - 1].X is null, "a line is separated from the one before it by a gap");
    }

    private sealed record Panel(JsonElement[] Traces, List<LinePoint> Lines, List<Mark> Markers, List<Label> Labels);

    private sealed record LinePoint(int Index, double? X, double? Y, string Hover);

    private sealed record Mark(int Index, double X, double Y, double Size, string Symbol, string Color, string Hover);

    private sealed record Label(double X, double Y, string Text);
}
