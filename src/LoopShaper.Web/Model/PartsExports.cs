namespace LoopShaper.Web.Model;

/// <summary>The files the parts panel offers, written by the core's exporters.</summary>
/// <param name="BaseName">File name without extension, from the design name.</param>
/// <param name="PartsCsv">The parts list (PartsListCsv).</param>
/// <param name="CompensatorNetlist">SPICE3 netlist of the compensator network.</param>
/// <param name="LoopNetlist">SPICE3 netlist of the averaged loop; null where it would not be the analysed loop (custom plant, peak current mode, DCM).</param>
public sealed record PartsExports(string BaseName, string PartsCsv, string CompensatorNetlist, string? LoopNetlist);
