using System.CommandLine;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Validation;

namespace LoopShaper.Cli;

/// <summary>
/// `suggest FILE [--method kfactor|resonance] [--type typeI|typeII|typeIII] [--crossover 50k] [--phase-margin 55]
/// [--write FILE] [--format text|json] [--out FILE]`: a starting placement with its derivation.
/// </summary>
internal static class SuggestCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var file = new Argument<string>("file") { Description = "Design file (docs/design-file.md)." };
        var method = new Option<string>("--method", "-m") { Description = "kfactor (Venable's K factor) or resonance (zeros at the plant's corners).", DefaultValueFactory = _ => "kfactor" };
        method.AcceptOnlyFromAmong("kfactor", "resonance");
        var type = new Option<string?>("--type", "-t") { Description = "Compensator type for the K factor: typeI, typeII or typeIII; default: from the boost needed. For resonance: the buck's control scheme picks the placement; on a custom plant, typeII picks the current-mode one." };
        type.AcceptOnlyFromAmong("typeI", "typeII", "typeIII");
        var crossover = new Option<string?>("--crossover") { Description = "Target crossover with SI prefix (50k, 50 kHz). Default: a tenth of the switching frequency." };
        var phaseMargin = new Option<string?>("--phase-margin") { Description = "Target phase margin in degrees. Default: the design's criteria.minPhaseMarginDeg." };
        var write = new Option<string?>("--write", "-w") { Description = "Also save the design with the suggested placement as its compensator to this design file." };
        var format = new Option<string>("--format", "-f") { Description = "Report format: text or json.", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong("text", "json");
        var outFile = new Option<string?>("--out", "-o") { Description = "Write the report to this file instead of the standard output." };
        var command = new Command("suggest", "Suggest a compensator placement for a target crossover and phase margin, by Venable's K factor or at the plant's resonance, with every derivation step. Exit code 0 when a placement was found, 2 for invalid input.")
        {
            file, method, type, crossover, phaseMargin, write, format, outFile,
        };
        command.SetAction(parse =>
        {
            string path = parse.GetValue(file)!;
            var design = DesignLoader.Load(path, error);
            bool valuesOk = CommandLineValues.TryRead(parse.GetValue(crossover), "--crossover", "Hz", 1e-3, 1e9, error, out double? fc)
                & CommandLineValues.TryRead(parse.GetValue(phaseMargin), "--phase-margin", "deg", 1, 179, error, out double? pm);
            if (design is null || !valuesOk)
            {
                return ExitCodes.InvalidInput;
            }

            var compensatorType = parse.GetValue(type) switch
            {
                "typeI" => CompensatorType.TypeI,
                "typeII" => CompensatorType.TypeII,
                "typeIII" => CompensatorType.TypeIII,
                _ => (CompensatorType?)null,
            };
            var placementMethod = parse.GetValue(method) == "kfactor" ? PlacementMethod.KFactor : ResonanceMethodFor(design.Plant, compensatorType);
            var request = PlacementAdvisor.RequestFor(design, placementMethod, compensatorType, fc, pm);
            var plant = DesignAnalyzer.BuildLoop(design).Loop.Plant;
            if (!PlacementAdvisor.TrySuggest(plant, request, out var suggestion, out var issues))
            {
                foreach (var i in issues.Where(i => i.Severity == Severity.Error))
                {
                    error.WriteLine($"{path}: error: {OptionOf(i.Field)}: {i.Message}");
                }

                return ExitCodes.InvalidInput;
            }

            var report = PlacementReport.From(design.Name, suggestion!);
            string text = parse.GetValue(format) == "json" ? SynthesisReportJson.Write(report) : PlacementReportText.Write(report);
            if (parse.GetValue(write) is string target && !DesignLoader.Emit(DesignFile.Write(design with { Compensator = suggestion!.Placement }), target, TextWriter.Null, error))
            {
                return ExitCodes.InvalidInput;
            }

            return DesignLoader.Emit(text, parse.GetValue(outFile), output, error) ? ExitCodes.Success : ExitCodes.InvalidInput;
        });
        return command;
    }

    /// <summary>
    /// The resonance placement a plant takes: by its control scheme for the buck (voltage mode: Type III; peak current
    /// mode: Type II); for a custom plant, the current-mode Type II when Type II is asked for, else the voltage-mode Type III.
    /// </summary>
    internal static PlacementMethod ResonanceMethodFor(Plant plant, CompensatorType? type) => plant switch
    {
        BuckPlant { Control: PeakCurrentModeControl } => PlacementMethod.CurrentModeResonance,
        BuckPlant => PlacementMethod.VoltageModeResonance,
        _ => type == CompensatorType.TypeII ? PlacementMethod.CurrentModeResonance : PlacementMethod.VoltageModeResonance,
    };

    /// <summary>The option or design-file path a finding of the placement advisor is about.</summary>
    private static string OptionOf(string field) => field switch
    {
        "synthesis.crossoverHz" => "--crossover",
        "synthesis.phaseMarginDeg" => "--phase-margin",
        "synthesis.type" => "--type",
        "synthesis.method" => "--method",
        "synthesis.switchingFrequencyHz" => "$.plant.switchingFrequencyHz",
        _ => IssueReport.PathOf(field),
    };
}
