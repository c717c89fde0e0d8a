using System.Globalization;
using System.Net;
using System.Text;
using LoopShaper.Core.Units;

namespace LoopShaper.Core.Reporting.Html;

/// <summary>
/// A line chart as inline SVG, so that a report needs no script and no network: a log or linear abscissa, a linear
/// ordinate with 1-2-5 ticks, grid lines, a legend and optional vertical markers. Culture-invariant numbers.
/// </summary>
public static class SvgChart
{
    private const double Width = 680, Height = 230, Left = 64, Right = 30, Top = 12, Bottom = 40;
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;
    private static readonly double[] NiceSteps = [1.0, 2.0, 5.0, 10.0];

    /// <summary>The chart as an &lt;svg&gt; element.</summary>
    /// <param name="title">Accessible title (also the aria-label).</param>
    /// <param name="series">The lines.</param>
    /// <param name="logX">True for a logarithmic abscissa (frequency).</param>
    /// <param name="xUnit">Unit of the abscissa for its tick labels ("Hz", "s").</param>
    /// <param name="yLabel">Axis label of the ordinate, with its unit.</param>
    /// <param name="markersX">Abscissae of vertical marker lines (crossover frequencies), with their labels.</param>
    public static string Render(string title, IReadOnlyList<ChartSeries> series, bool logX, string xUnit, string yLabel, IReadOnlyList<(double X, string Label)>? markersX = null)
    {
        ArgumentNullException.ThrowIfNull(series);
        var xs = series.SelectMany(s => s.X.Where((x, i) => double.IsFinite(x) && double.IsFinite(s.Y[i]) && (!logX || x > 0))).ToList();
        var ys = series.SelectMany(s => s.Y.Where(double.IsFinite)).ToList();
        var sb = new StringBuilder();
        sb.Append(Inv, $"<svg class=\"chart\" xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {Width} {Height}\" role=\"img\" aria-label=\"{Esc(title)}\">");
        sb.Append("<title>").Append(Esc(title)).Append("</title>");
        if (xs.Count == 0 || ys.Count == 0)
        {
            sb.Append(Inv, $"<text x=\"{Width / 2}\" y=\"{Height / 2}\" text-anchor=\"middle\">no data</text></svg>");
            return sb.ToString();
        }

        double x0 = xs.Min(), x1 = xs.Max();
        if (logX)
        {
            x0 = Math.Pow(10, Math.Floor(Math.Log10(x0) + 1e-9));
            x1 = Math.Pow(10, Math.Ceiling(Math.Log10(x1) - 1e-9));
        }

        if (!(x1 > x0))
        {
            x1 = x0 + 1;
        }

        var (y0, y1, yStep) = NiceRange(ys.Min(), ys.Max());
        double pw = Width - Left - Right, ph = Height - Top - Bottom;
        double Px(double x) => Left + (pw * (logX ? Math.Log10(x / x0) / Math.Log10(x1 / x0) : (x - x0) / (x1 - x0)));
        double Py(double y) => Top + (ph * (1 - ((y - y0) / (y1 - y0))));

        sb.Append(Inv, $"<rect x=\"{Left}\" y=\"{Top}\" width=\"{pw}\" height=\"{ph}\" fill=\"#fff\" stroke=\"#888\"/>");
        for (double y = y0; y <= y1 + (yStep * 1e-6); y += yStep)
        {
            double py = Py(y);
            sb.Append(Inv, $"<line x1=\"{Left}\" y1=\"{py:F1}\" x2=\"{Left + pw}\" y2=\"{py:F1}\" stroke=\"#ddd\"/>");
            sb.Append(Inv, $"<text x=\"{Left - 4}\" y=\"{py + 4:F1}\" text-anchor=\"end\" font-size=\"10\">{Esc(Number(y))}</text>");
        }

        foreach (double x in XTicks(x0, x1, logX))
        {
            double px = Px(x);
            sb.Append(Inv, $"<line x1=\"{px:F1}\" y1=\"{Top}\" x2=\"{px:F1}\" y2=\"{Top + ph}\" stroke=\"#ddd\"/>");
            sb.Append(Inv, $"<text x=\"{px:F1}\" y=\"{Top + ph + 14}\" text-anchor=\"middle\" font-size=\"10\">{Esc(EngineeringFormat.Format(x, xUnit, 3))}</text>");
        }

        sb.Append(Inv, $"<text x=\"14\" y=\"{Top + (ph / 2):F1}\" transform=\"rotate(-90 14 {Top + (ph / 2):F1})\" text-anchor=\"middle\" font-size=\"11\">{Esc(yLabel)}</text>");
        foreach (var (mx, label) in markersX ?? [])
        {
            if (mx >= x0 && mx <= x1 && (!logX || mx > 0))
            {
                double px = Px(mx);
                sb.Append(Inv, $"<line x1=\"{px:F1}\" y1=\"{Top}\" x2=\"{px:F1}\" y2=\"{Top + ph}\" stroke=\"#b00\" stroke-dasharray=\"3 3\"/>");
                sb.Append(Inv, $"<text x=\"{px + 3:F1}\" y=\"{Top + 11}\" font-size=\"10\" fill=\"#b00\">{Esc(label)}</text>");
            }
        }

        foreach (var s in series)
        {
            var path = new StringBuilder();
            bool pen = false;
            for (int i = 0; i < s.X.Length; i++)
            {
                double x = s.X[i], y = s.Y[i];
                if (!double.IsFinite(x) || !double.IsFinite(y) || (logX && x <= 0))
                {
                    pen = false;
                    continue;
                }

                path.Append(Inv, $"{(pen ? 'L' : 'M')}{Px(x):F1},{Py(Math.Clamp(y, y0, y1)):F1}");
                pen = true;
            }

            string dash = s.Dashed ? " stroke-dasharray=\"6 3\"" : "";
            sb.Append(Inv, $"<path d=\"{path}\" fill=\"none\" stroke=\"{Esc(s.Colour)}\" stroke-width=\"1.6\"{dash}><title>{Esc(s.Name)}</title></path>");
        }

        double lx = Left + 8;
        foreach (var s in series)
        {
            sb.Append(Inv, $"<line x1=\"{lx:F1}\" y1=\"{Height - 8}\" x2=\"{lx + 18:F1}\" y2=\"{Height - 8}\" stroke=\"{Esc(s.Colour)}\" stroke-width=\"2\"{(s.Dashed ? " stroke-dasharray=\"6 3\"" : "")}/>");
            sb.Append(Inv, $"<text x=\"{lx + 22:F1}\" y=\"{Height - 4}\" font-size=\"10\">{Esc(s.Name)}</text>");
            lx += 30 + (6.0 * s.Name.Length);
        }

        sb.Append("</svg>");
        return sb.ToString();
    }

    /// <summary>Axis limits and a 1-2-5 step that hold [lo, hi] in at most about eight intervals.</summary>
    internal static (double Lo, double Hi, double Step) NiceRange(double lo, double hi)
    {
        if (!(hi > lo))
        {
            double pad = Math.Max(Math.Abs(lo) * 0.1, 1.0);
            lo -= pad;
            hi += pad;
        }

        double raw = (hi - lo) / 8.0;
        double mag = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        double step = NiceSteps.Select(m => m * mag).First(s => s >= raw);
        return (Math.Floor(lo / step) * step, Math.Ceiling(hi / step) * step, step);
    }

    private static IEnumerable<double> XTicks(double x0, double x1, bool logX)
    {
        if (logX)
        {
            for (double d = x0; d <= x1 * (1 + 1e-9); d *= 10)
            {
                yield return d;
            }

            yield break;
        }

        var (lo, hi, step) = NiceRange(x0, x1);
        for (double x = lo; x <= hi + (step * 1e-6); x += step)
        {
            if (x >= x0 - (step * 1e-6) && x <= x1 + (step * 1e-6))
            {
                yield return x;
            }
        }
    }

    private static string Number(double y) => Math.Abs(y) < 1e-12 ? "0" : (Math.Abs(y) >= 1e4 || Math.Abs(y) < 1e-2 ? EngineeringFormat.Format(y, "", 3) : y.ToString("G4", Inv));

    private static string Esc(string s) => WebUtility.HtmlEncode(s);
}
