using System.Collections.Immutable;
using LoopShaper.Core.Design;
using LoopShaper.Core.Exports;
using LoopShaper.Core.Reporting;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.Validation;

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

    /// <summary>The latest synthesis, or null.</summary>
    public DesignSynthesis? Result { get; private set; }

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
                var (result, issues, exports) = await Task.Run(() => Synthesize(design)).ConfigureAwait(true);
                Result = result;
                Report = result is null ? null : SynthesisReport.From(result);
                Exports = exports;
                Errors = [.. issues.Where(i => i.Severity == Severity.Error)];
                ComputationError = null;
            }
            catch (Exception ex)
            {
                _logger.LogError(ex, "Synthesis of design '{Name}' failed", design.Name);
                Result = null;
                Report = null;
                Exports = null;
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

    private static (DesignSynthesis? Result, ImmutableArray<ValidationIssue> Issues, PartsExports? Exports) Synthesize(LoopDesign design)
    {
        if (!DesignSynthesizer.TrySynthesize(design, DesignSynthesizer.OptionsOf(design), out var result, out var issues))
        {
            return (null, issues, null);
        }

        var network = result!.Synthesis.ChosenNetwork;
        var exports = new PartsExports(
            Path.GetFileNameWithoutExtension(ShareToken.FileNameOf(design.Name)),
            PartsListCsv.Write(result.Synthesis),
            SpiceNetlist.Compensator(network, design.Name),
            AveragedLoopSupport.ReasonAgainst(result.BuiltDesign) is null ? SpiceNetlist.AveragedLoop(result.BuiltDesign, network) : null);
        return (result, issues, exports);
    }
}
