using System.Globalization;
using LoopShaper.Core.Design;
using LoopShaper.Library.Comparison;

namespace LoopShaper.Library.Tests;

/// <summary>The differing inputs (a walk of both design files) and the differing results of two designs.</summary>
public sealed class ComparisonTests
{
    [Fact]
    public void The_same_design_has_no_differing_input()
        => Assert.Empty(DesignFileDiff.Compare(DesignFile.Write(TempLibrary.CoreRail), DesignFile.Write(TempLibrary.CoreRail)));

    [Fact]
    public void One_changed_field_is_reported_at_its_json_path_with_both_values()
    {
        var a = TempLibrary.CoreRail;
        var b = a.WithInductance(220e-9);
        var diff = Assert.Single(DesignFileDiff.Compare(DesignFile.Write(a), DesignFile.Write(b)));
        Assert.Equal("$.plant.powerStage.inductor.inductanceH", diff.Path);
        Assert.Equal(a.InductanceH(), double.Parse(diff.A!, CultureInfo.InvariantCulture));
        Assert.Equal(220e-9, double.Parse(diff.B!, CultureInfo.InvariantCulture));
    }

    [Fact]
    public void Fields_present_on_one_side_only_are_listed_leaf_by_leaf()
    {
        var diffs = DesignFileDiff.Compare("""{"a": {"b": 1, "c": [1, 2]}, "d": true}""", """{"a": {"c": [1]}, "e": {"f": "x"}}""");
        Assert.Equal(["$.a.b", "$.a.c[1]", "$.d", "$.e.f"], diffs.Select(d => d.Path));
        Assert.Equal(("1", (string?)null), (diffs[0].A, diffs[0].B));
        Assert.Equal(((string?)null, "\"x\""), (diffs[3].A, diffs[3].B));
    }

    [Fact]
    public void Numbers_compare_by_value_and_a_kind_change_is_one_difference()
    {
        Assert.Empty(DesignFileDiff.Compare("""{"a": 1e-6}""", """{"a": 0.000001}"""));
        var d = Assert.Single(DesignFileDiff.Compare("""{"a": {"b": 1}}""", """{"a": 3}"""));
        Assert.Equal("$.a", d.Path);
    }

    [Fact]
    public void Two_designs_differ_in_the_results_their_analyses_give()
    {
        var a = DesignAnalyzer.Analyze(TempLibrary.CoreRail);
        var b = DesignAnalyzer.Analyze(TempLibrary.CoreRail.WithInductance(220e-9));
        Assert.DoesNotContain(ResultComparison.Compare(a, DesignAnalyzer.Analyze(TempLibrary.CoreRail)), f => f.Differs);

        var figures = ResultComparison.Compare(a, b);
        var pm = figures.Single(f => f.Name == "phase margin");
        Assert.True(pm.Differs);
        Assert.Equal(a.Margins!.PhaseMarginDeg, pm.A);
        Assert.Equal(b.Margins!.PhaseMarginDeg, pm.B);
        Assert.Equal(a.Margins.PhaseMarginDeg!.Value.ToString("F1", CultureInfo.InvariantCulture) + " deg", pm.TextA);
        // Ripple current dI = (Vin - Vout) D / (L fs) (Erickson & Maksimovic, 2nd ed., sec. 2.3, eq. 2.19): at equal
        // duty cycle (same DCR, so same losses) it scales as 1 / L, here 330 nH / 220 nH.
        var ripple = figures.Single(f => f.Name == "inductor ripple current (p-p)");
        Assert.True(ripple.Differs);
        Assert.Equal(330.0 / 220.0, ripple.B!.Value / ripple.A!.Value, 9);
    }
}
