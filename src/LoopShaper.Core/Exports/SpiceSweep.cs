namespace LoopShaper.Core.Exports;

/// <summary>The AC sweep written into an exported netlist: `.ac dec N start stop`.</summary>
/// <param name="PointsPerDecade">Points per decade, 1 to 1000.</param>
/// <param name="StartHz">First frequency, Hz.</param>
/// <param name="StopHz">Last frequency, Hz.</param>
public sealed record SpiceSweep(int PointsPerDecade = 40, double StartHz = 10.0, double StopHz = 10e6);
