using LoopShaper.Core.Design;

namespace LoopShaper.Web.Model;

/// <summary>
/// One engineer's open design: the form, the latest analysis from the core, and the recompute loop. Changes arriving
/// while an analysis runs are folded into one follow-up run (the light debounce), so the charts always end on the
/// latest input without queueing stale work.
/// </summary>
public sealed class DesignWorkspace
{
    private readonly ILogger _logger;
    private readonly Func<LoopDesign, DesignAnalysis> _analyze;
    private bool _running;
    private bool _pending;

    /// <summary>A workspace showing <paramref name="design"/>; <paramref name="analyze"/> replaces the core's analyser in tests.</summary>
    public DesignWorkspace(LoopDesign design, ILogger logger, Func<LoopDesign, DesignAnalysis>? analyze = null)
    {
        _logger = logger;
        _analyze = analyze ?? DesignAnalyzer.AnalyzeInteractive;
        Form = DesignForm.FromDesign(design);
    }

    /// <summary>Raised on the caller's context after every finished analysis and after selection changes.</summary>
    public event Action? Changed;

    /// <summary>The form.</summary>
    public DesignForm Form { get; private set; }

    /// <summary>The latest analysis, or null before the first one (or after a failed one).</summary>
    public DesignAnalysis? Analysis { get; private set; }

    /// <summary>The design the latest analysis was made of.</summary>
    public LoopDesign? AnalysedDesign { get; private set; }

    /// <summary>The core's findings of the latest analysis, by field.</summary>
    public FieldIssues Issues { get; private set; } = FieldIssues.None;

    /// <summary>Why the latest analysis failed, or null.</summary>
    public string? ComputationError { get; private set; }

    /// <summary>Counts finished analyses.</summary>
    public int Revision { get; private set; }

    /// <summary>The compensator singularity selected for keyboard nudging, or null.</summary>
    public PlacementTarget? Selected { get; private set; }

    /// <summary>Replaces the design (a file was opened) and analyses it.</summary>
    public Task LoadAsync(LoopDesign design)
    {
        Form = DesignForm.FromDesign(design);
        Selected = null;
        return RecomputeAsync();
    }

    /// <summary>Selects a compensator singularity (or none).</summary>
    public void Select(PlacementTarget? target)
    {
        Selected = target;
        Changed?.Invoke();
    }

    /// <summary>Analyses the current form; while one analysis runs, further calls are folded into one more run.</summary>
    public async Task RecomputeAsync()
    {
        if (_running)
        {
            _pending = true;
            return;
        }

        _running = true;
        try
        {
            do
            {
                _pending = false;
                var design = Form.Build();
                try
                {
                    long started = System.Diagnostics.Stopwatch.GetTimestamp();
                    var analysis = await Task.Run(() => _analyze(design)).ConfigureAwait(true);
                    if (_logger.IsEnabled(LogLevel.Debug))
                    {
                        _logger.LogDebug("Analysed '{Name}' in {Ms:F1} ms", design.Name, System.Diagnostics.Stopwatch.GetElapsedTime(started).TotalMilliseconds);
                    }
                    Analysis = analysis;
                    AnalysedDesign = design;
                    Issues = new FieldIssues(analysis.Issues);
                    ComputationError = null;
                }
                catch (Exception ex)
                {
                    _logger.LogError(ex, "Analysis of design '{Name}' failed", design.Name);
                    Analysis = null;
                    AnalysedDesign = design;
                    Issues = FieldIssues.None;
                    ComputationError = "The analysis failed: " + ex.Message;
                }

                Revision++;
                Changed?.Invoke();
            }
            while (_pending);
        }
        finally
        {
            _running = false;
        }
    }
}
