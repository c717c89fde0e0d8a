using LoopShaper.Core.Measurements;

namespace LoopShaper.Core.Tests.Measurements;

/// <summary>
/// Every layout docs/measured-csv.md promises. The expected numbers are the file's own numbers (times 1e3 for kHz,
/// 1e6 for MHz: SI prefixes, BIPM SI Brochure), so each test checks the reading, not a computation.
/// </summary>
public class MeasuredCsvLayoutTests
{
    private static MeasuredResponse ReadOk(string text)
    {
        var result = MeasuredCsvReader.Read(text);
        Assert.True(result.Succeeded, string.Join("\n", result.Errors));
        Assert.Empty(result.Errors);
        return result.Response!;
    }

    private static void AssertSamples(MeasuredResponse r, double[] hz, double[] db, double[] deg)
    {
        Assert.Equal(hz, r.Samples.FrequencyHz.ToArray());
        Assert.Equal(db, r.Samples.MagnitudeDb.ToArray());
        Assert.Equal(deg, r.Samples.PhaseDeg.ToArray());
    }

    [Fact]
    public void Comma_separated_with_a_header_in_hz()
    {
        var r = ReadOk("Frequency (Hz),Gain (dB),Phase (deg)\n100,40.5,-91.2\n1000,20.25,-120\n10000,-1.5e0,-175.5\n");
        AssertSamples(r, [100, 1000, 10000], [40.5, 20.25, -1.5], [-91.2, -120, -175.5]);
        Assert.Equal("Hz", r.FrequencyUnit);
        Assert.False(r.PhaseWasWrapped);
    }

    [Fact]
    public void Comma_separated_without_a_header_is_hz_gain_phase()
    {
        var r = ReadOk("100,40.5,-91.2\n1000,20.25,-120\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
    }

    [Fact]
    public void Semicolon_separated_with_decimal_commas()
    {
        var r = ReadOk("Freq [kHz];Magnitude [dB];Phase [deg]\n0,1;40,5;-91,2\n1;20,25;-120\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
        Assert.Equal("kHz", r.FrequencyUnit);
    }

    [Fact]
    public void Semicolon_separated_with_decimal_points_and_no_header()
    {
        var r = ReadOk("100;40.5;-91.2\r\n1000;20.25;-120\r\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
    }

    [Fact]
    public void Tab_separated_without_a_header()
    {
        var r = ReadOk("100\t40.5\t-91.2\n1000\t20.25\t-120\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
    }

    [Fact]
    public void Tab_separated_with_a_header_in_mhz()
    {
        var r = ReadOk("f (MHz)\tgain dB\tphase deg\n0.0001\t40.5\t-91.2\n0.001\t20.25\t-120\n");
        Assert.Equal("MHz", r.FrequencyUnit);
        Assert.Equal(100.0, r.Samples.FrequencyHz[0], 9);
        Assert.Equal(1000.0, r.Samples.FrequencyHz[1], 9);
    }

    [Fact]
    public void Khz_header_scales_frequencies_by_one_thousand()
    {
        var r = ReadOk("Frequency (kHz),Gain (dB),Phase (deg)\n0.5,30,-95\n2.5,10,-130\n");
        AssertSamples(r, [500, 2500], [30, 10], [-95, -130]);
    }

    [Fact]
    public void Extra_named_columns_are_ignored_and_columns_may_come_in_any_order()
    {
        var r = ReadOk("Index,Phase (deg),Coherence,Frequency (Hz),Gain (dB),Note\n1,-91.2,0.99,100,40.5,ok\n2,-120,0.98,1000,20.25,ok\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
        Assert.Equal(["Index", "Coherence", "Note"], r.IgnoredColumns);
    }

    [Fact]
    public void Comments_blank_lines_quotes_crlf_and_a_byte_order_mark_are_accepted()
    {
        var r = ReadOk("\uFEFF# bench measurement, injection at the feedback node\r\n! instrument settings\r\n\r\n\"Frequency (Hz)\",\"Gain (dB)\",\"Phase (deg)\"\r\n% sweep start\r\n100,40.5,-91.2\r\n\r\n1000,20.25,-120\r\n");
        AssertSamples(r, [100, 1000], [40.5, 20.25], [-91.2, -120]);
    }

    [Fact]
    public void Wrapped_phase_is_unwrapped_from_the_first_sample()
    {
        // Wrapped into (-180, 180]: -170, 175, 160, 20 are -170, -185, -200, -340 continuous. The rule is numpy.unwrap
        // with period 360 (its documentation: steps larger than half a period are folded by whole periods).
        var r = ReadOk("Frequency (Hz),Gain (dB),Phase (deg)\n100,10,-170\n200,5,175\n300,0,160\n1000,-20,20\n");
        AssertSamples(r, [100, 200, 300, 1000], [10, 5, 0, -20], [-170, -185, -200, -340]);
        Assert.True(r.PhaseWasWrapped);
    }

    [Fact]
    public void Unwrapped_phase_beyond_minus_180_is_kept_as_given()
    {
        var r = ReadOk("100,10,-170\n200,5,-185\n300,0,-200\n1000,-20,-340\n");
        AssertSamples(r, [100, 200, 300, 1000], [10, 5, 0, -20], [-170, -185, -200, -340]);
        Assert.False(r.PhaseWasWrapped);
    }

    [Fact]
    public void Bytes_are_read_as_utf8()
    {
        var r = MeasuredCsvReader.Read("Frequency (Hz),Gain (dB),Phase (°)\n100,40.5,-91.2\n1000,20.25,-120\n"u8);
        Assert.True(r.Succeeded, string.Join("\n", r.Errors));
        Assert.Equal([-91.2, -120], r.Response!.Samples.PhaseDeg.ToArray());
    }
}
