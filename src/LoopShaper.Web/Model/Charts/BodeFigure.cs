using System.Collections.Immutable;
using System.Globalization;
using System.Numerics;
using LoopShaper.Core.Analysis;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.TransferFunctions;
using LoopShaper.Core.Units;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;
using AnnotationFont = Plotly.Blazor.LayoutLib.AnnotationLib.Font;
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
        var annotations = new List<Annotation>();
        var shapes = new List<Shape>();
        if (analysis.LoopResponse is not FrequencyResponse loop || analysis.PlantResponse is not FrequencyResponse plant
            || analysis.CompensatorResponse is not FrequencyResponse comp || analysis.Margins is not StabilityMargins margins
            || analysis.Loop is null)
        {
            return new ChartFigure(data, BaseLayout((-60, 60), (-270, 0), annotations, shapes, analysis), []);
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

        // Gain crossovers: a dashed line through both panels, a dot at 0 dB and the phase margin beside the phase.
        var fcs = margins.GainCrossovers.Select(g => g.FrequencyHz).ToArray();
        var f180s = margins.PhaseCrossovers.Select(p => p.FrequencyHz).ToArray();
        data.Add(VerticalLines(fcs, magRange, "y", ChartPalette.Margin, "crossover"));
        data.Add(VerticalLines(fcs, phaseRange, "y2", ChartPalette.Margin, "crossover"));
        data.Add(Points("crossover", fcs, [.. fcs.Select(_ => 0.0)], "y", ChartPalette.Margin, MarkerSymbol.Circle, 10, false));
        data.Add(Points("phase at crossover", fcs, [.. margins.GainCrossovers.Select(g => g.PhaseDeg)], "y2", ChartPalette.Margin, MarkerSymbol.Circle, 10, false));
        data.Add(VerticalLines(f180s, magRange, "y", ChartPalette.GainMargin, "phase crossover"));
        data.Add(VerticalLines(f180s, phaseRange, "y2", ChartPalette.GainMargin, "phase crossover"));
        data.Add(Points("|T| at phase crossover", f180s, [.. margins.PhaseCrossovers.Select(p => p.MagnitudeDb)], "y", ChartPalette.GainMargin, MarkerSymbol.Square, 10, false));
        data.Add(Points("phase crossover", f180s, [.. margins.PhaseCrossovers.Select(p => p.CriticalPhaseDeg)], "y2", ChartPalette.GainMargin, MarkerSymbol.Square, 10, false));
        foreach (var g in margins.GainCrossovers)
        {
            bool worst = margins.WorstCrossover == g;
            annotations.Add(Note(
                g.FrequencyHz, g.PhaseDeg, "y2",
                $"fc {FormatHz(g.FrequencyHz)}<br><b>PM {Num(g.PhaseMarginDeg, "F1")}°</b>{(worst && margins.HasMultipleCrossovers ? " (smallest)" : string.Empty)}",
                ChartPalette.Margin, NearRightEdge(g.FrequencyHz, analysis) ? -80 : 48, -42));
        }

        // Phase crossovers: the magnitude there, and the gain margin.
        foreach (var p in margins.PhaseCrossovers)
        {
            string kind = p.GainMarginDb >= 0 ? "GM" : "lower GM";
            int k = annotations.Count(n => n.YRef == "y");
            int ax = k % 2 == 0 ? -70 : 40;
            annotations.Add(Note(p.FrequencyHz, p.MagnitudeDb, "y", $"{kind} <b>{Num(p.GainMarginDb, "F1")} dB</b><br>at {FormatHz(p.FrequencyHz)}", ChartPalette.GainMargin, NearRightEdge(p.FrequencyHz, analysis) ? -Math.Abs(ax) - 30 : ax, 48));
        }

        // The -180 + k 360 degree levels inside the phase panel, and 0 dB.
        for (double level = -180; level >= phaseRange.Min; level -= 360)
        {
            if (level <= phaseRange.Max)
            {
                shapes.Add(HorizontalLine(level, "y2", ChartPalette.Ink, "dash"));
                annotations.Add(new Annotation { XRef = "paper", X = 1.0m, XAnchor = Plotly.Blazor.LayoutLib.AnnotationLib.XAnchorEnum.Right, YRef = "y2", Y = level, Text = Num(level, "F0") + "°", ShowArrow = false, YShift = 10, Font = new AnnotationFont { Color = ChartPalette.Ink, Size = 12 } });
            }
        }

        shapes.Add(HorizontalLine(0, "y", ChartPalette.Ink, "solid"));

        // Poles and zeros: compensator ones are clickable, plant ones are reference marks.
        AddPlantSingularities(data, analysis);
        AddCompensatorSingularities(data, hits, analysis, selected);

        return new ChartFigure(data, BaseLayout(magRange, phaseRange, annotations, shapes, analysis), [.. hits]);
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

    private static void AddPlantSingularities(List<ITrace> data, DesignAnalysis analysis)
    {
        var plant = analysis.Loop!.Plant;
        var zeros = UpperHalf(plant.Zeros).Select(RootFrequencyHz).Where(f => InRange(f, analysis)).ToArray();
        var poles = UpperHalf(plant.Poles).Select(RootFrequencyHz).Where(f => InRange(f, analysis)).ToArray();
        data.Add(Points("plant zeros", zeros, [.. zeros.Select(plant.MagnitudeDb)], "y", ChartPalette.Plant, MarkerSymbol.CircleOpen, 12, true, "plant zero"));
        data.Add(Points("plant poles", poles, [.. poles.Select(plant.MagnitudeDb)], "y", ChartPalette.Plant, MarkerSymbol.X, 11, true, "plant pole"));
    }

    private static void AddCompensatorSingularities(List<ITrace> data, List<MarkerHit> hits, DesignAnalysis analysis, PlacementTarget? selected)
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

        AddClickable(data, hits, "compensator zeros", zeros, gc, MarkerSymbol.CircleOpen, "zero");
        AddClickable(data, hits, "compensator poles", poles, gc, MarkerSymbol.X, "pole");

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
            hits.Add(new MarkerHit(data.Count, 0, PlacementTarget.Gain));
            data.Add(Points("gain handle", [g.Hz], [g.Db], "y", ChartPalette.Loop, MarkerSymbol.Diamond, 14, true, "gain setting (" + design!.Gain.Kind + ")"));
        }

        if (selected is PlacementTarget t)
        {
            var all = zeros.Concat(poles).ToList();
            (double Hz, double Db)? at = t == PlacementTarget.Gain ? gain : all.Where(s => s.Target == t).Select(s => ((double, double)?)(s.Hz, gc.MagnitudeDb(s.Hz))).FirstOrDefault();
            if (at is { } a && InRange(a.Hz, analysis))
            {
                data.Add(new Scatter
                {
                    Name = "selected",
                    ShowLegend = false,
                    Mode = ModeFlag.Markers,
                    X = [a.Hz],
                    Y = [a.Db],
                    XAxis = "x",
                    YAxis = "y",
                    Marker = new Marker { Symbol = MarkerSymbol.CircleOpen, Size = 26, Color = ChartPalette.Ink, Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Width = 2.5m, Color = ChartPalette.Ink } },
                    HoverInfo = HoverInfoFlag.Skip,
                });
            }
        }
    }

    private static void AddClickable(List<ITrace> data, List<MarkerHit> hits, string name, List<(PlacementTarget Target, double Hz)> items, TransferFunction gc, MarkerSymbol symbol, string what)
    {
        var drawable = items.Where(i => double.IsFinite(i.Hz) && i.Hz > 0).ToList();
        for (int i = 0; i < drawable.Count; i++)
        {
            hits.Add(new MarkerHit(data.Count, i, drawable[i].Target));
        }

        data.Add(Points(name, [.. drawable.Select(i => i.Hz)], [.. drawable.Select(i => gc.MagnitudeDb(i.Hz))], "y", ChartPalette.Compensator, symbol, 15, true, "compensator " + what));
    }

    private static IEnumerable<Complex> UpperHalf(ImmutableArray<Complex> roots) => roots.Where(r => r.Imaginary >= 0);

    private static bool NearRightEdge(double hz, DesignAnalysis a)
        => Math.Log(hz / a.Design.Analysis.StartHz) / Math.Log(a.Design.Analysis.StopHz / a.Design.Analysis.StartHz) > 0.78;

    private static bool InRange(double hz, DesignAnalysis a) => double.IsFinite(hz) && hz >= a.Design.Analysis.StartHz && hz <= a.Design.Analysis.StopHz;

    private static Scatter Points(string name, double[] x, double[] y, string yAxis, string color, MarkerSymbol symbol, int size, bool legend, string? hoverName = null)
    {
        var keep = Enumerable.Range(0, Math.Min(x.Length, y.Length)).Where(i => double.IsFinite(x[i]) && double.IsFinite(y[i])).ToArray();
        return new Scatter
        {
            Name = name,
            ShowLegend = legend && keep.Length > 0,
            Mode = ModeFlag.Markers,
            X = [.. keep.Select(i => (object)x[i])],
            Y = [.. keep.Select(i => (object)y[i])],
            XAxis = "x",
            YAxis = yAxis,
            Marker = new Marker { Symbol = symbol, Size = size, Color = color, Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Width = 2.5m, Color = color } },
            HoverTemplate = (hoverName ?? name) + " %{x:.4s}Hz<extra></extra>",
        };
    }

    /// <summary>Dashed vertical lines at each frequency across one panel, in one trace (gaps between them).</summary>
    private static Scatter VerticalLines(double[] hz, (double Min, double Max) range, string yAxis, string color, string name) => new()
    {
        Name = name,
        LegendGroup = name,
        ShowLegend = false,
        Mode = ModeFlag.Lines,
        X = [.. hz.Where(double.IsFinite).SelectMany(f => new object?[] { f, f, null })],
        Y = [.. hz.Where(double.IsFinite).SelectMany(_ => new object?[] { range.Min, range.Max, null })],
        XAxis = "x",
        YAxis = yAxis,
        Line = new Line { Color = color, Width = 1.6m, Dash = "dash" },
        HoverInfo = HoverInfoFlag.Skip,
    };

    private static Shape HorizontalLine(double y, string yRef, string color, string dash) => new()
    {
        Type = Plotly.Blazor.LayoutLib.ShapeLib.TypeEnum.Line,
        XRef = "paper",
        X0 = 0m,
        X1 = 1m,
        YRef = yRef,
        Y0 = y,
        Y1 = y,
        Line = new Plotly.Blazor.LayoutLib.ShapeLib.Line { Color = color, Width = 1.4m, Dash = dash },
        Layer = Plotly.Blazor.LayoutLib.ShapeLib.LayerEnum.Below,
    };

    private static Annotation Note(double hz, double y, string yRef, string text, string color, int ax, int ay) => Callout.Beside(
        new Annotation
        {
            XRef = "x",
            X = Math.Log10(hz), // annotations on a log axis take log10 of the position (plotly.js convention)
            YRef = yRef,
            Y = y,
            Text = text,
            BgColor = "rgba(255,255,255,0.92)",
            BorderColor = color,
            BorderWidth = 1.5m,
            BorderPad = 4m,
            Font = new AnnotationFont { Color = ChartPalette.Ink, Size = ChartPalette.FontSize },
        },
        right: ax > 0,
        above: ay < 0);

    private static Layout BaseLayout((double Min, double Max) mag, (double Min, double Max) phase, List<Annotation> annotations, List<Shape> shapes, DesignAnalysis analysis)
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
                    ZeroLine = false,
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
            Annotations = annotations,
            Shapes = shapes,
        };
    }

    private static string FormatHz(double hz) => EngineeringFormat.Format(hz, "Hz");

    private static string Num(double v, string format) => v.ToString(format, CultureInfo.InvariantCulture).Replace("-", "\u2212", StringComparison.Ordinal);
}
