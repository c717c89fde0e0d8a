using System.CommandLine;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli;

/// <summary>
/// `export FILE --netlist [--loop] | --parts [--out FILE]`: the compensator's SPICE netlist, the loop's (averaged
/// circuit or state-space realisation of the analysed plant, <see cref="SpiceNetlist.Loop"/>), or the parts list CSV. A design given by parts is exported as it is; a placement is synthesised first (as `synthesize`).
/// </summary>
internal static class ExportCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var netlist = new Option<bool>("--netlist") { Description = "Write the SPICE3 netlist of the compensator network (AC analysis, ngspice -b)." };
        var loop = new Option<bool>("--loop") { Description = "With --netlist: the small-signal loop instead, loop gain v(t): the averaged circuit for voltage-mode CCM, a state-space realisation of the analysed plant for peak current mode, DCM and custom plants." };
        var parts = new Option<bool>("--parts") { Description = "Write the parts list as CSV: designator, value, unit, display, series, tolerance, role." };
        var outFile = new Option<string?>("--out", "-o") { Description = "Write to this file instead of the standard output." };
        var synthesis = new SynthesisCommandLine();
        var command = new Command("export", "Export the compensator: its SPICE netlist (--netlist), the loop's (--netlist --loop) or the parts list CSV (--parts). A placement is synthesised into standard parts first. Exit code 0 when written, 2 for invalid input.")
        {
            file, netlist, loop, parts, outFile,
        };
        synthesis.AddTo(command);
        command.SetAction(parse =>
        {
            string path = parse.GetValue(file)!;
            bool wantNetlist = parse.GetValue(netlist), wantParts = parse.GetValue(parts), wantLoop = parse.GetValue(loop);
            if (wantNetlist == wantParts)
            {
                error.WriteLine("error: export needs exactly one of --netlist and --parts.");
                return ExitCodes.InvalidInput;
            }

            if (wantLoop && !wantNetlist)
            {
                error.WriteLine("error: --loop: goes with --netlist (the loop's netlist), not with --parts.");
                return ExitCodes.InvalidInput;
            }

            if (DesignLoader.Load(path, error) is not { } design || !synthesis.TryOptions(parse, design, error, out var options))
            {
                return ExitCodes.InvalidInput;
            }

            if (design.Compensator is TransconductanceNetwork)
            {
                if (!DesignSynthesizer.TrySynthesizeOta(design, options, out var ota, out var otaIssues))
                {
                    DesignLoader.ReportAll(error, path, otaIssues.Where(i => i.Severity == Severity.Error));
                    return ExitCodes.InvalidInput;
                }

                var divider = ota!.BuiltDesign.Plant is Core.PlantModels.BuckPlant b ? b.Feedback : null;
                if (wantNetlist && !wantLoop && divider is null)
                {
                    error.WriteLine($"{path}: error: $.plant: the OTA netlist needs the buck's feedback divider; a custom plant has none.");
                    return ExitCodes.InvalidInput;
                }

                string? otaText = wantParts ? PartsListCsv.Write(ota.Synthesis)
                    : wantLoop ? LoopNetlist(ota.BuiltDesign, ota.Synthesis.ChosenNetwork, path, error)
                    : SpiceNetlist.Compensator(ota.Synthesis.ChosenNetwork, divider!, design.Name);
                return otaText is not null && DesignLoader.Emit(otaText, parse.GetValue(outFile), output, error) ? ExitCodes.Success : ExitCodes.InvalidInput;
            }

            OpAmpNetwork network;
            NetworkSynthesis? synthesised = null;
            if (design.Compensator is OpAmpNetwork given)
            {
                network = given;
            }
            else if (DesignSynthesizer.TrySynthesize(design, options, out var result, out var issues))
            {
                synthesised = result!.Synthesis;
                network = (OpAmpNetwork)result.BuiltDesign.Compensator;
                design = result.BuiltDesign;
            }
            else
            {
                DesignLoader.ReportAll(error, path, issues.Where(i => i.Severity == Severity.Error));
                return ExitCodes.InvalidInput;
            }

            string? text = wantParts
                ? synthesised is not null ? PartsListCsv.Write(synthesised) : PartsListCsv.Write(NetworkPartsList.Of(network, options))
                : wantLoop ? LoopNetlist(design, network, path, error) : SpiceNetlist.Compensator(network, design.Name);
            return text is not null && DesignLoader.Emit(text, parse.GetValue(outFile), output, error) ? ExitCodes.Success : ExitCodes.InvalidInput;
        });
        return command;
    }

    /// <summary>The loop netlist (<see cref="SpiceNetlist.Loop"/>); null after writing why the loop could not be built.</summary>
    private static string? LoopNetlist(Core.Design.LoopDesign design, Compensator network, string path, TextWriter error)
    {
        try
        {
            return SpiceNetlist.Loop(design, network);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            error.WriteLine($"{path}: error: $: the loop netlist could not be written: {ex.Message.Split(" (Parameter")[0]}");
            return null;
        }
    }
}
