using LoopShaper.Core.Design;
using LoopShaper.Core.Measurements;

namespace LoopShaper.Web.Model.Charts;

/// <summary>The core's comparison of a measurement with the analysed design, or null when either is missing.</summary>
public static class MeasuredOverlay
{
    /// <summary>Trace name of the measured response on the loop chart.</summary>
    public const string MeasuredName = "measured";

    /// <summary>The comparison of <paramref name="measured"/> with the loop of <paramref name="analysis"/>.</summary>
    public static MeasurementComparison? Compare(DesignAnalysis? analysis, MeasuredSet? measured)
        => analysis?.Loop is { } loop && measured is not null ? MeasurementComparison.Of(measured.Response, measured.Quantity, loop) : null;
}
