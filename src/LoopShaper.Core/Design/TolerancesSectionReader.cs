using System.Collections.Immutable;
using LoopShaper.Core.Corners;

namespace LoopShaper.Core.Design;

/// <summary>Reads the design file's optional "tolerances" section (docs/design-file.md) into <see cref="ToleranceSpec"/>; a missing field takes its default.</summary>
internal static class TolerancesSectionReader
{
    public static ToleranceSpec Read(JsonFieldReader t)
    {
        var d = ToleranceSpec.Default;
        var spec = new ToleranceSpec
        {
            InductancePct = t.Number("inductancePct", "%", d.InductancePct),
            CapacitancePct = t.Number("capacitancePct", "%", d.CapacitancePct),
            DcBiasFactor = t.Number("dcBiasFactor", string.Empty, d.DcBiasFactor),
            Capacitors = Capacitors(t),
            EsrLowFactor = t.Number("esrLowFactor", string.Empty, d.EsrLowFactor),
            EsrHighFactor = t.Number("esrHighFactor", string.Empty, d.EsrHighFactor),
            DcrLowFactor = t.Number("dcrLowFactor", string.Empty, d.DcrLowFactor),
            DcrHighFactor = t.Number("dcrHighFactor", string.Empty, d.DcrHighFactor),
            SenseGainPct = t.Number("senseGainPct", "%", d.SenseGainPct),
            RampPct = t.Number("rampPct", "%", d.RampPct),
            TransconductancePct = t.Number("transconductancePct", "%", d.TransconductancePct),
        };
        t.Finish("the tolerances");
        return spec;
    }

    /// <summary>tolerances.capacitors: one entry per output-capacitor branch label; a label given twice is an error at the second.</summary>
    private static ImmutableSortedDictionary<string, CapacitorTolerance> Capacitors(JsonFieldReader t)
    {
        var map = ImmutableSortedDictionary.CreateBuilder<string, CapacitorTolerance>(StringComparer.Ordinal);
        var fallback = new CapacitorTolerance();
        foreach (var (item, path) in t.Array("capacitors", required: false))
        {
            var c = t.OpenItem(item, path);
            if (!c.IsObject)
            {
                continue;
            }

            string label = c.Text("label");
            var tolerance = new CapacitorTolerance(c.Number("tolerancePct", "%", fallback.TolerancePct), c.Number("dcBiasFactor", string.Empty, fallback.DcBiasFactor));
            c.Finish("a capacitor tolerance");
            if (label.Length > 0 && !map.TryAdd(label, tolerance))
            {
                c.Error(JsonFieldReader.Child(path, "label"), $"'{label}' is given twice: one entry per output-capacitor branch label.");
            }
        }

        return map.ToImmutable();
    }
}
