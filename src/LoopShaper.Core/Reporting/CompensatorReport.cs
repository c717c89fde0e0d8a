namespace LoopShaper.Core.Reporting;

/// <summary>The compensator as analysed: its placement with the gain resolved to an integrator frequency (from parts or a crossover target).</summary>
/// <param name="Type">"typeI", "typeII" or "typeIII".</param>
/// <param name="IntegratorHz">Unity-gain frequency of the integrator, Hz.</param>
/// <param name="Zero1Hz">First zero, Hz (Type II and III).</param>
/// <param name="Zero2Hz">Second zero, Hz (Type III).</param>
/// <param name="Pole1Hz">First pole, Hz (Type II and III).</param>
/// <param name="Pole2Hz">Second pole, Hz (Type III).</param>
public sealed record CompensatorReport(string Type, double? IntegratorHz, double? Zero1Hz, double? Zero2Hz, double? Pole1Hz, double? Pole2Hz);
