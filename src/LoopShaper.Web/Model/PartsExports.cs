namespace LoopShaper.Web.Model;

/// <summary>The files the parts panel offers, written by the core's exporters.</summary>
/// <param name="BaseName">File name without extension, from the design name.</param>
/// <param name="PartsCsv">The parts list (PartsListCsv).</param>
/// <param name="CompensatorNetlist">SPICE3 netlist of the compensator network; null for an OTA network on a custom plant (no divider resistors).</param>
/// <param name="LoopNetlist">SPICE3 netlist of the loop (SpiceNetlist.Loop): the averaged circuit for voltage-mode CCM, the state-space realisation of the analysed plant otherwise.</param>
public sealed record PartsExports(string BaseName, string PartsCsv, string? CompensatorNetlist, string LoopNetlist);
