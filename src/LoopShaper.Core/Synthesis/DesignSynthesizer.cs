using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Validation;

namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Synthesises the op-amp network of a design (<see cref="NetworkSynthesizer"/>) and analyses the design again with
/// the parts to build, so that the criteria are judged on the values that go on the board.
/// </summary>
public static class DesignSynthesizer
{
    /// <summary>The synthesis options of a design: its synthesis section, or the section's defaults.</summary>
    public static SynthesisOptions OptionsOf(LoopDesign design) => (design.Synthesis ?? new SynthesisSettings()).ToOptions();

    /// <summary>
    /// Synthesises and re-analyses; false with the reasons (field-named, design-file paths) for an invalid design, bad
    /// options or a placement no op-amp network realises. Warnings come back in <paramref name="issues"/> either way.
    /// </summary>
    public static bool TrySynthesize(LoopDesign design, SynthesisOptions options, out DesignSynthesis? result, out ImmutableArray<ValidationIssue> issues)
    {
        result = null;
        issues = [.. DesignValidator.Validate(design), .. NetworkSynthesizer.Validate(options)];
        if (design.Compensator is TransconductanceNetwork)
        {
            issues = issues.Add(new ValidationIssue("compensator.form", "this synthesis makes op-amp Type I, II and III networks; a transconductance (OTA) compensator goes through TrySynthesizeOta."));
        }

        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return false;
        }

        NetworkSynthesis synthesis;
        try
        {
            synthesis = NetworkSynthesizer.Synthesize(design, options);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            issues = issues.Add(new ValidationIssue("compensator", "no op-amp network was synthesised: " + ex.Message.Split(" (Parameter")[0]));
            return false;
        }

        var built = WithParts(design, synthesis.ChosenNetwork);
        var analysis = DesignAnalyzer.Analyze(built);
        if (!analysis.IsValid)
        {
            issues = issues.AddRange(analysis.Issues.Where(i => i.Severity == Severity.Error));
            return false;
        }

        result = new DesignSynthesis(design, options, synthesis, built, analysis);
        return true;
    }

    /// <summary>
    /// Synthesises the OTA Type II network of a design whose compensator is a <see cref="TransconductanceNetwork"/>
    /// (gm and Ro from its amplifier, the placement its parts give with Ro infinite) and re-analyses the design with the
    /// parts to build (the searched ones when the neighbour search ran, else the snapped ones); false with the reasons
    /// (field-named) otherwise.
    /// </summary>
    public static bool TrySynthesizeOta(LoopDesign design, SynthesisOptions options, out OtaDesignSynthesis? result, out ImmutableArray<ValidationIssue> issues)
    {
        result = null;
        issues = [.. DesignValidator.Validate(design), .. NetworkSynthesizer.Validate(options)];
        if (design.Compensator is not TransconductanceNetwork ota)
        {
            issues = issues.Add(new ValidationIssue("compensator.form", "the OTA synthesis needs a transconductance compensator (compensator.form = ota)."));
        }
        else if (ota.Type != CompensatorType.TypeII)
        {
            issues = issues.Add(new ValidationIssue("compensator.type", $"the OTA synthesis makes a Type II network; this compensator is {ota.Type}: allowed typeII."));
        }

        if (issues.Any(i => i.Severity == Severity.Error))
        {
            return false;
        }

        var g = (TransconductanceNetwork)design.Compensator;
        OtaNetworkSynthesis synthesis;
        try
        {
            var loop = DesignAnalyzer.BuildLoop(design).Loop;
            var rest = loop.Modulator.Multiply(loop.ControlToOutput).Scale(loop.SenseGain);
            var o = options with
            {
                StartHz = options.StartHz ?? design.Analysis.StartHz,
                StopHz = options.StopHz ?? design.Analysis.StopHz,
            };
            synthesis = OtaNetworkSynthesizer.Synthesize(rest, g.ToPlacement(), g.Amplifier, o);
        }
        catch (Exception ex) when (ex is ArgumentException or InvalidOperationException or ArithmeticException)
        {
            issues = issues.Add(new ValidationIssue("compensator", "no OTA network was synthesised: " + ex.Message.Split(" (Parameter")[0]));
            return false;
        }

        var built = design with { Compensator = synthesis.ChosenNetwork };
        var analysis = DesignAnalyzer.Analyze(built);
        if (!analysis.IsValid)
        {
            issues = issues.AddRange(analysis.Issues.Where(i => i.Severity == Severity.Error));
            return false;
        }

        result = new OtaDesignSynthesis(design, options, synthesis, built, analysis);
        return true;
    }

    /// <summary>
    /// The design with a network as its compensator, around the design's own op-amp when it names one (the parts are
    /// computed for an ideal amplifier; the criteria are judged with the real one). For a buck whose network carries
    /// the divider's bottom resistor, the feedback divider becomes R1 over R4: R1 is the divider's top resistor
    /// (shared/CONVENTIONS.md).
    /// </summary>
    public static LoopDesign WithParts(LoopDesign design, OpAmpNetwork network)
    {
        if (network.Amplifier is null && design.Compensator is OpAmpNetwork { Amplifier: { } amplifier })
        {
            network = network with { Amplifier = amplifier };
        }

        return design.Plant is BuckPlant buck && network.RBottomOhm > 0
            ? design with { Compensator = network, Plant = buck with { Feedback = new FeedbackDivider(network.R1Ohm, network.RBottomOhm, buck.Feedback.ReferenceV) } }
            : design with { Compensator = network };
    }
}
