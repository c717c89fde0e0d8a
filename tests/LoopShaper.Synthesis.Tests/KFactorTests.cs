using LoopShaper.Core.Compensators;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Synthesis.Tests;

/// <summary>Venable's K factor formulas (H. D. Venable, Proc. Powercon 10, 1983) at several boosts.</summary>
public class KFactorTests
{
    private static readonly double Sqrt2 = Math.Sqrt(2), Sqrt3 = Math.Sqrt(3), Sqrt6 = Math.Sqrt(6);

    public static TheoryData<double, double> TypeIICases => new()
    {
        // K = tan(boost/2 + 45 deg) (Venable 1983), with exact values of the tangent: tan 45 = 1, tan 60 = sqrt 3,
        // tan 67.5 = 1 + sqrt 2, tan 75 = 2 + sqrt 3, tan 82.5 = sqrt 6 + sqrt 3 + sqrt 2 + 2 (half-angle identities).
        { 0.0, 1.0 },
        { 30.0, Sqrt3 },
        { 45.0, 1 + Sqrt2 },
        { 60.0, 2 + Sqrt3 },
        { 75.0, Sqrt6 + Sqrt3 + Sqrt2 + 2 },
    };

    public static TheoryData<double, double> TypeIIICases => new()
    {
        // K = tan^2(boost/4 + 45 deg) (Venable 1983): the squares of the same exact tangents.
        { 0.0, 1.0 },
        { 60.0, 3.0 },
        { 90.0, 3 + (2 * Sqrt2) },
        { 120.0, 7 + (4 * Sqrt3) },
        { 150.0, Math.Pow(Sqrt6 + Sqrt3 + Sqrt2 + 2, 2) },
    };

    [Theory]
    [MemberData(nameof(TypeIICases))]
    public void Type_II_K_is_tan_of_half_the_boost_plus_45_degrees(double boostDeg, double expectedK)
    {
        double k = KFactor.TypeII(boostDeg);
        Assert.Equal(expectedK, k, expectedK * 1e-12);
        Assert.Equal(boostDeg, KFactor.TypeIIBoostDeg(k), 1e-9);
    }

    [Theory]
    [MemberData(nameof(TypeIIICases))]
    public void Type_III_K_is_tan_squared_of_a_quarter_of_the_boost_plus_45_degrees(double boostDeg, double expectedK)
    {
        double k = KFactor.TypeIII(boostDeg);
        Assert.Equal(expectedK, k, expectedK * 1e-12);
        Assert.Equal(boostDeg, KFactor.TypeIIIBoostDeg(k), 1e-9);
    }

    [Theory]
    [InlineData(CompensatorType.TypeII, 20.0)]
    [InlineData(CompensatorType.TypeII, 55.0)]
    [InlineData(CompensatorType.TypeII, 85.0)]
    [InlineData(CompensatorType.TypeIII, 40.0)]
    [InlineData(CompensatorType.TypeIII, 110.0)]
    [InlineData(CompensatorType.TypeIII, 170.0)]
    public void The_placed_zeros_and_poles_give_exactly_the_boost_at_their_geometric_mean(CompensatorType type, double boostDeg)
    {
        // The property the K factor is built on (Venable 1983): with fz = fc/K, fp = fc K (Type II) or the double pair at
        // fc/sqrt K and fc sqrt K (Type III), the phase of (1/s) times the pairs at fc is -90 + boost.
        const double fc = 40e3;
        var placement = type == CompensatorType.TypeII
            ? new CompensatorPlacement(type, new GainSetting(GainSettingKind.IntegratorHz, 1.0), Zero1Hz: fc / KFactor.TypeII(boostDeg), Pole1Hz: fc * KFactor.TypeII(boostDeg))
            : new CompensatorPlacement(type, new GainSetting(GainSettingKind.IntegratorHz, 1.0), fc / Math.Sqrt(KFactor.TypeIII(boostDeg)), fc / Math.Sqrt(KFactor.TypeIII(boostDeg)), fc * Math.Sqrt(KFactor.TypeIII(boostDeg)), fc * Math.Sqrt(KFactor.TypeIII(boostDeg)));
        Assert.Equal(-90.0 + boostDeg, placement.UnitShape().PhaseDeg(fc), 1e-9);
    }

    [Fact]
    public void Required_boost_is_the_margin_less_90_less_the_plant_phase()
    {
        // boost = PM - 90 - phase(plant) (Venable 1983): 45 deg margin over a plant at -150 deg needs 105 deg.
        Assert.Equal(105.0, KFactor.RequiredBoostDeg(45.0, -150.0), 1e-12);
        Assert.Equal(-55.0, KFactor.RequiredBoostDeg(45.0, 10.0), 1e-12);
    }
}
