using System.Collections.Immutable;
using System.Globalization;
using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Units;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AxisTitle = Plotly.Blazor.LayoutLib.YAxisLib.Title;
using MarkerSymbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// The loop-gain Bode chart: magnitude over phase on one shared logarithmic frequency axis, plant, compensator and
/// loop traces, crossovers with their phase margin, phase crossovers with their gain margin, the -180 degree line
/// and the poles and zeros of plant and compensator. Every number comes from the core's <see cref="DesignAnalysis"/>.
/// </summary>
public static class BodeFigure
{
    /// <summary>Trace names, also the legend text.</summary>
    public const string LoopName = "loop T";

    /// <summary>Plant trace name.</summary>
    public const string PlantName = "plant Fm·Gvd";

    /// <summary>Compensator trace name.</summary>
    public const string CompensatorName = "compensator Gc";

    /// <summary>Compensator trace name with an ideal amplifier.</summary>
    public const string IdealCompensatorName = "Gc, ideal amplifier";

    /// <summary>Loop trace name with an ideal amplifier.</summary>
    public const string IdealLoopName = "T, ideal amplifier";

    /// <summary>Name of the trace with every mark of the magnitude panel (crossover lines, margins, poles and zeros).</summary>
    public const string MagnitudeMarksName = "magnitude marks";

    /// <summary>Name of the trace with every mark of the phase panel (crossover lines, the -180 degree line, margins).</summary>
    public const string PhaseMarksName = "phase marks";

    /// <summary>Hover of the marks: what the point is and its frequency.</summary>
    public const string MarksHover = "%{hovertext} %{x:.4s}Hz<extra></extra>";

    /// <summary>Size of the ring around the selected marker, px.</summary>
    public const int SelectedRingSize = 26;

    /// <summary>Most points drawn per trace.</summary>
    public const int MaxPoints = 500;

    /// <summary>Largest distance of the drawn magnitude from the computed one between drawn points, dB.</summary>
    public const double MagnitudeToleranceDb = 0.05;

    /// <summary>Largest distance of the drawn phase from the computed one between drawn points, degrees.</summary>
    public const double PhaseToleranceDeg = 0.1;

    /// <summary>Builds the figure of an analysis, with a measured response beside the model when one is given.</summary>
    public static ChartFigure Build(DesignAnalysis analysis, BodeTraces show, PlacementTarget? selected, Core.Measurements.MeasurementComparison? measured = null)
    {
        var data = new List<ITrace>();
        var hits = new List<MarkerHit>();
        if (analysis.LoopResponse is not FrequencyResponse loop || analysis.PlantResponse is not FrequencyResponse plant
            || analysis.CompensatorResponse is not FrequencyResponse comp || analysis.Margins is not StabilityMargins margins
            || analysis.Loop is null)
        {
            return new ChartFigure(data, BaseLayout((-60, 60), (-270, 0), analysis), []);
        }

        var visible = new List<FrequencyResponse>();
        AddResponse(data, loop, LoopName, ChartPalette.Loop, "solid", 3.2m, show.Loop);
        AddResponse(data, plant, PlantName, ChartPalette.Plant, "dash", 2.4m, show.Plant);
        AddResponse(data, comp, CompensatorName, ChartPalette.Compensator, "dot", 2.6m, show.Compensator);
        if (analysis.IdealAmplifierLoopResponse is FrequencyResponse idealLoop && analysis.IdealAmplifierCompensatorResponse is FrequencyResponse idealComp)
        {
            AddResponse(data, idealLoop, IdealLoopName, ChartPalette.Loop, "dashdot", 1.6m, show.IdealAmplifier);
            AddResponse(data, idealComp, IdealCompensatorName, ChartPalette.Compensator, "dashdot", 1.6m, show.IdealAmplifier);
        }
        if (show.Loop)
        {
            visible.Add(loop);
        }

        if (show.Plant)
        {
            visible.Add(plant);
        }

        if (show.Compensator)
        {
            visible.Add(comp);
        }

        if (visible.Count == 0)
        {
            visible.Add(loop);
        }

        if (measured is not null)
        {
            AddMeasured(data, measured);
            visible.Add(measured.Measured);
        }

        var magRange = BodeAxes.MagnitudeRange(visible.SelectMany(r => r.MagnitudeDb));
        var phaseRange = BodeAxes.PhaseRange(visible.SelectMany(r => r.PhaseDeg));

        // The small marks of a panel are three traces (ChartMarks: lines, markers, labels): plotly.js redraws a dozen
        // one-point traces, layout shapes and annotations far slower than the same marks as points of a few traces.
        var magMarks = new ChartMarks(MagnitudeMarksName, "x", "y", ReferenceLine);
        var phaseMarks = new ChartMarks(PhaseMarksName, "x", "y2", ReferenceLine);

        // Gain crossovers and phase crossovers: a dashed line through both panels.
        foreach (var g in margins.GainCrossovers)
        {
            magMarks.Segment(g.FrequencyHz, magRange.Min, g.FrequencyHz, magRange.Max, "crossover");
            phaseMarks.Segment(g.FrequencyHz, phaseRange.Min, g.FrequencyHz, phaseRange.Max, "crossover");
        }

        foreach (var p in margins.PhaseCrossovers)
        {
            magMarks.Segment(p.FrequencyHz, magRange.Min, p.FrequencyHz, magRange.Max, "phase crossover");
            phaseMarks.Segment(p.FrequencyHz, phaseRange.Min, p.FrequencyHz, phaseRange.Max, "phase crossover");
        }

        // The -180 + k 360 degree levels inside the phase panel, labelled at the right end; 0 dB is the magnitude axis's zero line.
        var a = analysis.Design.Analysis;
        for (double level = -180; level >= phaseRange.Min; level -= 360)
        {
            if (level <= phaseRange.Max)
            {
                string label = Num(level, "F0") + "°";
                phaseMarks.Segment(a.StartHz, level, a.StopHz, level, label, label, Plotly.Blazor.Traces.ScatterLib.TextPositionEnum.TopLeft);
            }
        }

        // A dot at 0 dB on each crossover, and the phase there with the phase margin beside it.
        foreach (var g in margins.GainCrossovers)
        {
            bool worst = margins.WorstCrossover == g;
            string text = $"fc {FormatHz(g.FrequencyHz)}<br><b>PM {Num(g.PhaseMarginDeg, "F1")}°</b>{(worst && margins.HasMultipleCrossovers ? " (smallest)" : string.Empty)}";
            magMarks.Point(g.FrequencyHz, 0, MarkerSymbol.Circle, 10, ChartPalette.Margin, "crossover");
            phaseMarks.Point(g.FrequencyHz, g.PhaseDeg, MarkerSymbol.Circle, 10, ChartPalette.Margin, "phase at crossover", text, Callout.Position(right: !NearRightEdge(g.FrequencyHz, analysis), above: true));
        }

        // Phase crossovers: the magnitude there with the gain margin beside it, alternately left and right.
        int k = 0;
        foreach (var p in margins.PhaseCrossovers)
        {
            string kind = p.GainMarginDb >= 0 ? "GM" : "lower GM";
            string text = $"{kind} <b>{Num(p.GainMarginDb, "F1")} dB</b><br>at {FormatHz(p.FrequencyHz)}";
            bool right = k++ % 2 == 1 && !NearRightEdge(p.FrequencyHz, analysis);
            magMarks.Point(p.FrequencyHz, p.MagnitudeDb, MarkerSymbol.Square, 10, ChartPalette.GainMargin, "|T| at phase crossover", text, Callout.Position(right, above: false));
            phaseMarks.Point(p.FrequencyHz, p.CriticalPhaseDeg, MarkerSymbol.Square, 10, ChartPalette.GainMargin, "phase crossover");
        }

        // Poles and zeros: compensator ones are clickable, plant ones are reference marks.
        AddPlantSingularities(magMarks, analysis);
        int magIndex = data.Count + ChartMarks.MarkersTrace;
        AddCompensatorSingularities(magMarks, magIndex, hits, analysis, selected);
        data.AddRange(magMarks.ToTraces(MarksHover));
        data.AddRange(phaseMarks.ToTraces(MarksHover));

        return new ChartFigure(data, BaseLayout(magRange, phaseRange, analysis), [.. hits]);
    }

    /// <summary>The frequency of a pole or zero given in rad/s: its distance from the origin over 2 pi, Hz.</summary>
    public static double RootFrequencyHz(Complex root) => Complex.Abs(root) / (2 * Math.PI);

    private static void AddResponse(List<ITrace> data, FrequencyResponse r, string name, string color, string dash, decimal width, bool show)
    {
        // A trace switched off is not sent at all (switching it on rebuilds the figure): every trace costs a redraw
        // its share of serialisation on the server and of plotly.js's work in the browser.
        if (!show)
        {
            return;
        }

        // Magnitude to a thousandth of a dB and phase to a thousandth of a degree: far below what a chart can show.
        // Points a straight segment draws to within MagnitudeToleranceDb / PhaseToleranceDeg are dropped (a fraction
        // of a pixel), which keeps each redraw small; extremes (resonance peaks) always survive.
        var mag = ChartNumbers.Simplified(r.FrequencyHz, r.MagnitudeDb, MagnitudeToleranceDb, logX: true, MaxPoints, 1e-3);
        var phase = ChartNumbers.Simplified(r.FrequencyHz, r.PhaseDeg, PhaseToleranceDeg, logX: true, MaxPoints, 1e-3);
        data.Add(new Scatter
        {
            Name = name,
            LegendGroup = name,
            Mode = ModeFlag.Lines,
            X = mag.X,
            Y = mag.Y,
            XAxis = "x",
            YAxis = "y",
            Line = new Line { Color = color, Width = width, Dash = dash },
            HoverTemplate = name + ": %{y:.1f} dB at %{x:.4s}Hz<extra></extra>",
        });
        data.Add(new Scatter
        {
            Name = name + " phase",
            LegendGroup = name,
            ShowLegend = false,
            Mode = ModeFlag.Lines,
            X = phase.X,
            Y = phase.Y,
            XAxis = "x",
            YAxis = "y2",
            Line = new Line { Color = color, Width = width, Dash = dash },
            HoverTemplate = name + ": %{y:.1f}° at %{x:.4s}Hz<extra></extra>",
        });
    }

    /// <summary>The measured samples as markers joined by a thin line, magnitude and (aligned) phase, in the measurement's colour.</summary>
    private static void AddMeasured(List<ITrace> data, Core.Measurements.MeasurementComparison measured)
    {
        var r = measured.Measured;
        string what = measured.Quantity == Core.Measurements.MeasuredQuantity.LoopGain ? "T" : "plant";
        var mag = ChartNumbers.Thinned(r.FrequencyHz, r.MagnitudeDb, MaxPoints, 1e-3);
        var phase = ChartNumbers.Thinned(r.FrequencyHz, r.PhaseDeg, MaxPoints, 1e-3);
        foreach (var (xy, axis, name, unit) in new[] { (mag, "y", MeasuredOverlay.MeasuredName + " " + what, " dB"), (phase, "y2", MeasuredOverlay.MeasuredName + " " + what + " phase", "°") })
        {
            data.Add(new Scatter
            {
                Name = name,
                LegendGroup = MeasuredOverlay.MeasuredName,
                ShowLegend = axis == "y",
                Mode = ModeFlag.Lines | ModeFlag.Markers,
                X = xy.X,
                Y = xy.Y,
                XAxis = "x",
                YAxis = axis,
                Line = new Line { Color = ChartPalette.Measured, Width = 1m },
                Marker = new Marker { Color = ChartPalette.Measured, Size = 5, Symbol = MarkerSymbol.Diamond },
                HoverTemplate = name + ": %{y:.1f}" + unit + " at %{x:.4s}Hz<extra></extra>",
            });
        }
    }

    private static void AddPlantSingularities(ChartMarks marks, DesignAnalysis analysis)
    {
        var plant = analysis.Loop!.Plant;
        foreach (double f in UpperHalf(plant.Zeros).Select(RootFrequencyHz).Where(f => InRange(f, analysis)))
        {
            marks.Point(f, plant.MagnitudeDb(f), MarkerSymbol.CircleOpen, 12, ChartPalette.Plant, "plant zero");
        }

        foreach (double f in UpperHalf(plant.Poles).Select(RootFrequencyHz).Where(f => InRange(f, analysis)))
        {
            marks.Point(f, plant.MagnitudeDb(f), MarkerSymbol.X, 11, ChartPalette.Plant, "plant pole");
        }
    }

    private static void AddCompensatorSingularities(ChartMarks marks, int traceIndex, List<MarkerHit> hits, DesignAnalysis analysis, PlacementTarget? selected)
    {
        if (analysis.ResolvedPlacement is not CompensatorPlacement placement)
        {
            return;
        }

        var gc = analysis.Loop!.Compensator;
        var zeros = new List<(PlacementTarget Target, double Hz)>();
        var poles = new List<(PlacementTarget Target, double Hz)>();
        if (placement.Zero1Hz is double z1 && placement.Type != CompensatorType.TypeI)
        {
            zeros.Add((PlacementTarget.Zero1, z1));
        }

        if (placement.Zero2Hz is double z2 && placement.Type == CompensatorType.TypeIII)
        {
            zeros.Add((PlacementTarget.Zero2, z2));
        }

        if (placement.Pole1Hz is double p1 && placement.Type != CompensatorType.TypeI)
        {
            poles.Add((PlacementTarget.Pole1, p1));
        }

        if (placement.Pole2Hz is double p2 && placement.Type == CompensatorType.TypeIII)
        {
            poles.Add((PlacementTarget.Pole2, p2));
        }

        // Each clickable marker is one point of the markers trace; the hit map names the quantity behind its index.
        var drawn = new List<(PlacementTarget Target, double Hz, double Db, string Hover)>();
        foreach (var (items, symbol, what) in new[] { (zeros, MarkerSymbol.CircleOpen, "compensator zero"), (poles, MarkerSymbol.X, "compensator pole") })
        {
            foreach (var (target, hz) in items.Where(i => double.IsFinite(i.Hz) && i.Hz > 0))
            {
                double db = gc.MagnitudeDb(hz);
                if (marks.Point(hz, db, symbol, 15, ChartPalette.Compensator, what) is int index)
                {
                    hits.Add(new MarkerHit(traceIndex, index, target));
                    drawn.Add((target, hz, db, what));
                }
            }
        }

        // The gain handle: the crossover target on the loop at 0 dB, otherwise the integrator frequency on Gc.
        var design = analysis.Design.Compensator as CompensatorPlacement;
        (double Hz, double Db)? gain = design?.Gain.Kind switch
        {
            GainSettingKind.CrossoverHz => (design.Gain.Value, 0.0),
            GainSettingKind.IntegratorHz => (design.Gain.Value, gc.MagnitudeDb(design.Gain.Value)),
            GainSettingKind.MidbandGainDb when placement.Zero1Hz is double z => (z, gc.MagnitudeDb(z)),
            _ => null,
        };
        if (gain is { } g && InRange(g.Hz, analysis))
        {
            string hover = "gain setting (" + design!.Gain.Kind + ")";
            if (marks.Point(g.Hz, g.Db, MarkerSymbol.Diamond, 14, ChartPalette.Loop, hover) is int index)
            {
                hits.Add(new MarkerHit(traceIndex, index, PlacementTarget.Gain));
                drawn.Add((PlacementTarget.Gain, g.Hz, g.Db, hover));
            }
        }

        // The selected quantity: a dark ring over its marker, drawn after it (on top) and clickable like it.
        if (selected is PlacementTarget t && drawn.Where(d => d.Target == t).ToList() is [var s] && InRange(s.Hz, analysis))
        {
            if (marks.Point(s.Hz, s.Db, MarkerSymbol.CircleOpen, SelectedRingSize, ChartPalette.Ink, "selected: " + s.Hover) is int ring)
            {
                hits.Add(new MarkerHit(traceIndex, ring, t));
            }
        }
    }

    /// <summary>The reference lines of the marks: dashed, dark grey (the markers on them carry the colours).</summary>
    private static Line ReferenceLine => new() { Color = ChartPalette.Reference, Width = 1.4m, Dash = "dash" };

    private static IEnumerable<Complex> UpperHalf(ImmutableArray<Complex> roots) => roots.Where(r => r.Imaginary >= 0);

    private static bool NearRightEdge(double hz, DesignAnalysis a)
        => Math.Log(hz / a.Design.Analysis.StartHz) / Math.Log(a.Design.Analysis.StopHz / a.Design.Analysis.StartHz) > 0.78;

    private static bool InRange(double hz, DesignAnalysis a) => double.IsFinite(hz) && hz >= a.Design.Analysis.StartHz && hz <= a.Design.Analysis.StopHz;

    private static Layout BaseLayout((double Min, double Max) mag, (double Min, double Max) phase, DesignAnalysis analysis)
    {
        var a = analysis.Design.Analysis;
        return new Layout
        {
            Font = new Font { Family = ChartPalette.FontFamily, Size = ChartPalette.FontSize, Color = ChartPalette.Ink },
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Margin = new Margin { L = 78, R = 24, T = 14, B = 58 },
            ShowLegend = false,
            Legend = [new Legend { Orientation = Plotly.Blazor.LayoutLib.LegendLib.OrientationEnum.H, X = 0m, Y = 1.09m, ItemClick = Plotly.Blazor.LayoutLib.LegendLib.ItemClickEnum.False, ItemDoubleClick = Plotly.Blazor.LayoutLib.LegendLib.ItemDoubleClickEnum.False, Font = new Plotly.Blazor.LayoutLib.LegendLib.Font { Size = 13 } }],
            HoverMode = HoverModeEnum.Closest,
            UiRevision = "bode",
            XAxis = [BodeAxes.Frequency(a.StartHz, a.StopHz)],
            YAxis =
            [
                new YAxis
                {
                    TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow,
                    Title = new AxisTitle { Text = "magnitude (dB)" },
                    Domain = [0.53m, 1m],
                    Range = [mag.Min, mag.Max],
                    DTick = 20,
                    GridColor = ChartPalette.Grid,
                    ZeroLine = true, // the 0 dB line, drawn with the axis (a layout shape costs a redraw more)
                    ZeroLineColor = ChartPalette.Ink,
                    ZeroLineWidth = 1.4m,
                    ShowLine = true,
                    LineColor = ChartPalette.Ink,
                    Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True,
                },
                new YAxis
                {
                    TickLabelOverflow = Plotly.Blazor.LayoutLib.YAxisLib.TickLabelOverflowEnum.Allow,
                    Title = new AxisTitle { Text = "phase (deg)" },
                    Domain = [0m, 0.47m],
                    Range = [phase.Min, phase.Max],
                    DTick = 45,
                    GridColor = ChartPalette.Grid,
                    ZeroLine = false,
                    ShowLine = true,
                    LineColor = ChartPalette.Ink,
                    Mirror = Plotly.Blazor.LayoutLib.YAxisLib.MirrorEnum.True,
                },
            ],
        };
    }

    private static string FormatHz(double hz) => EngineeringFormat.Format(hz, "Hz");

    private static string Num(double v, string format) => v.ToString(format, CultureInfo.InvariantCulture).Replace("-", "\u2212", StringComparison.Ordinal);
}
