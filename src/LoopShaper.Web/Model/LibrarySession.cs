using LoopShaper.Library;

namespace LoopShaper.Web.Model;

/// <summary>
/// One browser tab's link to the library (a scoped service: one per circuit): which revision the open design was
/// opened from or last saved as, and which two designs the compare panel shows.
/// </summary>
public sealed class LibrarySession
{
    private DesignForm? _basisForm;

    /// <summary>Raised when the basis or the comparison changes.</summary>
    public event Action? Changed;

    /// <summary>The revision the open design came from, or null; valid only while the workspace still holds the same form.</summary>
    public RevisionInfo? Basis { get; private set; }

    /// <summary>The comparison asked for from the history, or null.</summary>
    public (CompareSide A, CompareSide B)? Comparison { get; private set; }

    /// <summary>Counts comparisons asked for, so that the same pair asked for twice is redrawn.</summary>
    public int ComparisonRequest { get; private set; }

    /// <summary>The basis of <paramref name="workspace"/>'s design: null once another design was opened in it (a file, the demo, a link).</summary>
    public RevisionInfo? BasisOf(DesignWorkspace workspace) => ReferenceEquals(workspace.Form, _basisForm) ? Basis : null;

    /// <summary>Records that the workspace's current form is (or was saved as) <paramref name="revision"/>.</summary>
    public void SetBasis(DesignWorkspace workspace, RevisionInfo revision)
    {
        _basisForm = workspace.Form;
        Basis = revision;
        Changed?.Invoke();
    }

    /// <summary>Asks the compare panel to show <paramref name="a"/> against <paramref name="b"/>.</summary>
    public void Compare(CompareSide a, CompareSide b)
    {
        Comparison = (a, b);
        ComparisonRequest++;
        Changed?.Invoke();
    }
}
