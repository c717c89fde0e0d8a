using LoopShaper.Core.Analysis;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Core.Tests;

public class FrequencyGridTests
{
    [Fact]
    public void Log_grid_includes_both_ends_and_is_geometric()
    {
        var f = new FrequencyGrid(10, 1e6, 101).LogSpaced();
        Assert.Equal(10.0, f[0]);
        Assert.Equal(1e6, f[^1]);
        // 101 points over 5 decades: ratio 10^(5/100) between neighbours (definition of a log grid).
        Assert.Equal(Math.Pow(10, 0.05), f[51] / f[50], 12);
    }

    [Fact]
    public void Adaptive_grid_packs_points_around_a_resonance()
    {
        // A Q = 20 pole pair at 1 kHz: the adaptive grid must put several points within +-5 % of it,
        // where an even 200-point grid over 6 decades puts about one (our rule for the grid, no source).
        var h = TransferFunction.FromFactors(1, 0, [], [Factor.Pair(1000, 20)]);
        var even = new FrequencyGrid(1, 1e6, 200).LogSpaced().Count(x => x > 950 && x < 1050);
        var adaptive = new FrequencyGrid(1, 1e6, 200).Adaptive([h]).Count(x => x > 950 && x < 1050);
        Assert.True(even <= 2, $"even grid has {even} points near the peak");
        Assert.True(adaptive >= 10, $"adaptive grid has {adaptive} points near the peak");
    }

    [Fact]
    public void Automatic_range_spans_every_root_with_margin()
    {
        var h = TransferFunction.FromFactors(1, -1, [Factor.Real(300)], [Factor.Real(2e5), Factor.Pair(5e3, 3)]);
        var g = FrequencyGrid.Automatic([h]);
        Assert.Equal(10.0, g.StartHz, 9);  // 300 Hz / 30
        Assert.Equal(6e6, g.StopHz, 3);    // 200 kHz x 30
    }
}
