using LoopShaper.Core.Compensators;
using LoopShaper.Core.Synthesis;
using LoopShaper.Core.TransferFunctions;

namespace LoopShaper.Synthesis.Tests;

/// <summary>Placement -> parts -> transfer function -> placement, and parts -> placement -> parts, for every topology.</summary>
public class RoundTripTests
{
    private const double Relative = 1e-9;

    public static TheoryData<CompensatorPlacement> Placements => new()
    {
        // Placements of our own: fi, zeros and poles in Hz.
        new CompensatorPlacement(CompensatorType.TypeI, new GainSetting(GainSettingKind.IntegratorHz, 1.7e3)),
        new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 2.2e3), Zero1Hz: 3.1e3, Pole1Hz: 95e3),
        new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.IntegratorHz, 4.4e3), 8.9e3, 12.5e3, 48e3, 300e3),
        new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.IntegratorHz, 900), 2e3, 2e3, 180e3, 180e3),
    };

    [Theory]
    [MemberData(nameof(Placements))]
    public void Placement_to_parts_and_back_reproduces_the_placement(CompensatorPlacement placement)
    {
        foreach (double r1 in new[] { 1e3, 10e3, 49.9e3, 1e6 })
        {
            var n = OpAmpSynthesis.IdealNetwork(placement, r1);
            Assert.Equal(r1, n.R1Ohm);
            var back = n.ToPlacement();
            Assert.Equal(placement.Type, back.Type);
            Assert.Equal(GainSettingKind.IntegratorHz, back.Gain.Kind);
            Close(placement.Gain.Value, back.Gain.Value);
            Close(placement.Zero1Hz, back.Zero1Hz);
            Close(placement.Zero2Hz, back.Zero2Hz);
            Close(placement.Pole1Hz, back.Pole1Hz);
            Close(placement.Pole2Hz, back.Pole2Hz);
        }
    }

    [Theory]
    [MemberData(nameof(Placements))]
    public void Impedance_ratio_of_the_synthesised_parts_has_the_placement_roots(CompensatorPlacement placement)
    {
        // Independent of OpAmpNetwork.ToPlacement: Gc = Zf / Zin built from the parts with the transfer-function algebra,
        // Zf = (R2 + 1/(s C1)) || 1/(s C2) = (1 + s R2 C1) / (s (C1 + C2) + s^2 R2 C1 C2) and
        // 1/Zin = 1/R1 + s C3 / (1 + s R3 C3) (the circuit of the op-amp network; Type I: Zf = 1/(s C1), Zin = R1).
        var n = OpAmpSynthesis.IdealNetwork(placement, 10e3);
        TransferFunction zf = n.Type == CompensatorType.TypeI
            ? TransferFunction.FromCoefficients([1.0], [n.C1F, 0.0])
            : TransferFunction.FromCoefficients([n.R2Ohm * n.C1F, 1.0], [n.R2Ohm * n.C1F * n.C2F, n.C1F + n.C2F, 0.0]);
        var yin = TransferFunction.Constant(1.0 / n.R1Ohm);
        if (n.Type == CompensatorType.TypeIII)
        {
            yin = yin.Add(TransferFunction.FromCoefficients([n.C3F, 0.0], [n.R3Ohm * n.C3F, 1.0]));
        }

        var gc = zf.Multiply(yin);
        Assert.Equal(-1, gc.OriginOrder);
        Close(2 * Math.PI * placement.Gain.Value, gc.Gain);
        var zeros = gc.Zeros.Select(z => -z.Real / (2 * Math.PI)).Order().ToArray();
        var poles = gc.Poles.Select(p => -p.Real / (2 * Math.PI)).Order().ToArray();
        Assert.All(gc.Zeros.Concat(gc.Poles), r => Assert.Equal(0.0, r.Imaginary));
        var expectedZeros = placement.ZerosHz.Order().ToArray();
        var expectedPoles = placement.PolesHz.Order().ToArray();
        Assert.Equal(expectedZeros.Length, zeros.Length);
        Assert.Equal(expectedPoles.Length, poles.Length);
        // A double root found as a root of one quadratic is accurate to sqrt(eps) only; distinct roots to round-off.
        double tol = expectedZeros.Distinct().Count() < expectedZeros.Length ? 1e-6 : Relative;
        for (int i = 0; i < zeros.Length; i++)
        {
            Assert.Equal(expectedZeros[i], zeros[i], expectedZeros[i] * tol);
        }

        for (int i = 0; i < poles.Length; i++)
        {
            Assert.Equal(expectedPoles[i], poles[i], expectedPoles[i] * tol);
        }
    }

    [Fact]
    public void Parts_to_placement_and_back_reproduce_the_parts()
    {
        // The networks of the core's ngspice test, as an engineer would have drawn them.
        var networks = new[]
        {
            new OpAmpNetwork(CompensatorType.TypeI, R1Ohm: 10e3, C1F: 10e-9),
            new OpAmpNetwork(CompensatorType.TypeII, R1Ohm: 49.9e3, C1F: 1.5e-9, R2Ohm: 100e3, C2F: 47e-12),
            new OpAmpNetwork(CompensatorType.TypeIII, R1Ohm: 10e3, C1F: 4.7e-9, R2Ohm: 20e3, C2F: 100e-12, R3Ohm: 330, C3F: 2.2e-9),
        };
        foreach (var n in networks)
        {
            var back = OpAmpSynthesis.IdealNetwork(n.ToPlacement(), n.R1Ohm);
            Close(n.C1F, back.C1F);
            Close(n.C2F, back.C2F);
            Close(n.R2Ohm, back.R2Ohm);
            Close(n.R3Ohm, back.R3Ohm);
            Close(n.C3F, back.C3F);
        }
    }

    [Fact]
    public void Swapped_pairing_is_used_when_the_given_one_puts_a_pole_below_its_zero()
    {
        // Zero1 = 20 kHz with Pole1 = 15 kHz cannot be one feedback pair; paired the other way round it can.
        var p = new CompensatorPlacement(CompensatorType.TypeIII, new GainSetting(GainSettingKind.IntegratorHz, 3e3), 20e3, 5e3, 15e3, 200e3);
        var back = OpAmpSynthesis.IdealNetwork(p, 10e3).ToPlacement();
        Close(p.Gain.Value, back.Gain.Value);
        Assert.Equal(p.ZerosHz.Order().ToArray(), back.ZerosHz.Order().ToArray(), new Near());
        Assert.Equal(p.PolesHz.Order().ToArray(), back.PolesHz.Order().ToArray(), new Near());
        var bad = new CompensatorPlacement(CompensatorType.TypeII, new GainSetting(GainSettingKind.IntegratorHz, 3e3), Zero1Hz: 20e3, Pole1Hz: 15e3);
        var ex = Assert.Throws<ArgumentException>(() => OpAmpSynthesis.IdealNetwork(bad, 10e3));
        Assert.Contains("pole above its zero", ex.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(100e-6, 0.5, 1.1e3, 2.5e3, 60e3)]
    [InlineData(1e-3, 0.08, 700, 900, 300e3)]
    public void Ota_type_II_parts_and_back(double gmS, double hdiv, double fi, double fz, double fp)
    {
        var parts = OtaSynthesis.TypeII(gmS, hdiv, fi, fz, fp);
        var back = OtaSynthesis.TypeIIPlacement(gmS, hdiv, parts);
        Close(fi, back.Gain.Value);
        Close(fz, back.Zero1Hz);
        Close(fp, back.Pole1Hz);

        // Independent: Gc = Hdiv gm Zo with Zo = (R2 + 1/(s C1)) || 1/(s C2) from its coefficients.
        var zo = TransferFunction.FromCoefficients([parts.R2Ohm * parts.C1F, 1.0], [parts.R2Ohm * parts.C1F * parts.C2F, parts.C1F + parts.C2F, 0.0]).Scale(hdiv * gmS);
        Close(2 * Math.PI * fi, zo.Gain);
        Close(fz, -zo.Zeros[0].Real / (2 * Math.PI));
        Close(fp, -zo.Poles[0].Real / (2 * Math.PI));
    }

    private static void Close(double? expected, double? actual)
    {
        Assert.Equal(expected is null, actual is null);
        if (expected is double e)
        {
            Assert.True(Math.Abs(actual!.Value - e) <= Relative * Math.Abs(e), $"expected {e:R}, got {actual:R} (relative {(actual - e) / e:G3})");
        }
    }

    private sealed class Near : IEqualityComparer<double>
    {
        public bool Equals(double x, double y) => Math.Abs(x - y) <= Relative * Math.Abs(x);

        public int GetHashCode(double obj) => 0;
    }
}
