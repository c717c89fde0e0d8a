namespace LoopShaper.Core.Corners;

/// <summary>How far a Monte Carlo run has got.</summary>
/// <param name="Completed">Samples analysed so far.</param>
/// <param name="Total">Samples asked for.</param>
public sealed record MonteCarloProgress(int Completed, int Total)
{
    /// <summary>Completed / Total, 0 to 1.</summary>
    public double Fraction => Total > 0 ? (double)Completed / Total : 1.0;
}
