using System.Collections.Immutable;
using LoopShaper.Core.Compensators;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.PlantModels;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Validation;
using static LoopShaper.Core.Units.EngineeringFormat;

namespace LoopShaper.Web.Model;

/// <summary>
/// The parts of the open design: synthesised by the core (<see cref="DesignSynthesizer"/>) when the engineer asks,
/// and again after every change of the design from then on, folded like the workspace's analyses. Holds the report
/// and the export files; computes nothing itself.
/// </summary>
public sealed class PartsWorkspace : IDisposable
{
    private readonly DesignWorkspace _workspace;
    private readonly ILogger _logger;
    private bool _running;
    private bool _pending;

    /// <summary>Parts for the design of <paramref name="workspace"/>.</summary>
    public PartsWorkspace(DesignWorkspace workspace, ILogger logger)
    {
        _workspace = workspace;
        _logger = logger;
        _workspace.Changed += OnWorkspaceChanged;
    }

    /// <summary>Raised on the caller's context after every finished synthesis.</summary>
    public event Action? Changed;

    /// <summary>True once parts were asked for: from then on they follow the design.</summary>
    public bool IsActive { get; private set; }

    /// <summary>True while a synthesis runs.</summary>
    public bool IsRunning => _running;

    /// <summary>The latest op-amp synthesis, or null (also for an OTA compensator).</summary>
    public DesignSynthesis? Result { get; private set; }

    /// <summary>The latest OTA synthesis (transconductance compensator), or null.</summary>
    public OtaDesignSynthesis? OtaResult { get; private set; }

    /// <summary>What the parts are scaled from, in words: R1 (op-amp network) or gm and the divider (OTA); null before a synthesis.</summary>
    public string? Anchor { get; private set; }

    /// <summary>The latest synthesis as report data, or null.</summary>
    public SynthesisReport? Report { get; private set; }

    /// <summary>The files of the latest synthesis, or null.</summary>
    public PartsExports? Exports { get; private set; }

    /// <summary>Why no parts could be chosen (input errors, a placement no network realises), field by field.</summary>
    public ImmutableArray<ValidationIssue> Errors { get; private set; } = [];

    /// <summary>Why the latest synthesis failed unexpectedly, or null.</summary>
    public string? ComputationError { get; private set; }

    /// <summary>The workspace revision the latest result belongs to.</summary>
    public int DesignRevision { get; private set; } = -1;

    /// <inheritdoc />
    public void Dispose() => _workspace.Changed -= OnWorkspaceChanged;

    /// <summary>Chooses parts for the current design and keeps them following it.</summary>
    public Task ChooseAsync()
    {
        IsActive = true;
        return RunAsync();
    }

    private void OnWorkspaceChanged()
    {
        if (IsActive && _workspace.Revision != DesignRevision)
        {
            _ = RunAsync();
        }
    }

    private async Task RunAsync()
    {
        if (_running)
        {
            _pending = true;
            return;
        }

        _running = true;
        while (true)
        {
            _pending = false;
            int revision = _workspace.Revision;
            var design = _workspace.Form.Build();
            try
            {
                var done = await Task.Run(() => Synthesize(design)).ConfigureAwait(true);
                var issues = done.Issues;
                Result = done.Result;
                OtaResult = done.Ota;
                Report = done.Result is { } result ? SynthesisReport.From(result) : done.Ota is { } ota ? SynthesisReport.From(ota) : null;
                Exports = done.Exports;
                Anchor = done.Anchor;
                Errors = [.. issues.Where(i => i.Severity == Severity.Error)];
                ComputationError = null;
            }
            catch (Exception ex)
            {
                _logger.LogError(ex, "Synthesis of design '{Name}' failed", design.Name);
                Result = null;
                OtaResult = null;
                Report = null;
                Exports = null;
                Anchor = null;
                Errors = [];
                ComputationError = "Choosing the parts failed: " + ex.Message;
            }

            DesignRevision = revision;
            // Not running any more when the listeners look, unless a change arrived meanwhile.
            bool again = _pending;
            _running = again;
            Changed?.Invoke();
            if (!again)
            {
                return;
            }
        }
    }

    private static Synthesized Synthesize(LoopDesign design)
    {
        string baseName = Path.GetFileNameWithoutExtension(ShareToken.FileNameOf(design.Name));
        if (design.Compensator is TransconductanceNetwork)
        {
            if (!DesignSynthesizer.TrySynthesizeOta(design, DesignSynthesizer.OptionsOf(design), out var ota, out var otaIssues))
            {
                return new(null, null, otaIssues, null, null);
            }

            var chosen = ota!.Synthesis.ChosenNetwork;
            var divider = ota.BuiltDesign.Plant is BuckPlant buck ? buck.Feedback : null;
            var otaExports = new PartsExports(
                baseName,
                PartsListCsv.Write(ota.Synthesis),
                divider is null ? null : SpiceNetlist.Compensator(chosen, divider, design.Name),
                SpiceNetlist.Loop(ota.BuiltDesign, chosen));
            string anchor = $"gm = {Format(chosen.Amplifier.TransconductanceS, "S")} of the OTA (Ro = {Format(chosen.Amplifier.OutputResistanceOhm, "Ohm")})"
                + (divider is null ? ", the custom plant's divider ratio" : $", divider {Format(divider.TopOhm, "Ohm")} over {Format(divider.BottomOhm, "Ohm")} from the plant")
                + ": R2, C1 and C2 follow from the placement" + (ota.Synthesis.Search is null ? string.Empty : ", then from the neighbour search (gm and the divider fixed)");
            return new(null, ota, otaIssues, otaExports, anchor);
        }

        if (!DesignSynthesizer.TrySynthesize(design, DesignSynthesizer.OptionsOf(design), out var result, out var issues))
        {
            return new(null, null, issues, null, null);
        }

        var network = result!.Synthesis.ChosenNetwork;
        var exports = new PartsExports(
            baseName,
            PartsListCsv.Write(result.Synthesis),
            SpiceNetlist.Compensator(network, design.Name),
            SpiceNetlist.Loop(result.BuiltDesign, network));
        return new(result, null, issues, exports, $"R1 = {Format(network.R1Ohm, "Ohm")}, the input resistor and divider top: every other part follows from it");
    }

    private sealed record Synthesized(DesignSynthesis? Result, OtaDesignSynthesis? Ota, ImmutableArray<ValidationIssue> Issues, PartsExports? Exports, string? Anchor);
}
