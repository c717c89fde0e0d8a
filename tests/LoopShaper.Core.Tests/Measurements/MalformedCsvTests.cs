using System.Text;
using LoopShaper.Core.Measurements;

namespace LoopShaper.Core.Tests.Measurements;

/// <summary>
/// Thirty-two files that must not be imported: each gives an error on the expected line with a message that says
/// what is wrong, and no response at all (all or nothing). Expected lines are counted by hand in each file.
/// </summary>
public class MalformedCsvTests
{
    private const string H = "Frequency (Hz),Gain (dB),Phase (deg)\n";

    public static TheoryData<string, string, int, string> Files => new()
    {
        { "empty", "", 1, "empty" },
        { "blank lines only", "\n  \n\t\n", 1, "empty" },
        { "comments only", "# sweep\n# nothing\n", 1, "empty" },
        { "binary at the start", "\u0089PNG\r\n\u001a\n\0\0\0\rIHDR", 1, "binary" },
        { "binary in the middle", H + "100,40,-90\n\0\u0001\u0002\u0003\n", 3, "binary" },
        { "NaN frequency", H + "100,40,-90\nNaN,30,-100\n", 3, "frequency 'NaN' is not a finite number" },
        { "NaN gain", "100,40,-90\n200,NaN,-100\n", 2, "gain 'NaN' is not a finite number" },
        { "NaN phase", "100,40,-90\n200,30,nan\n300,20,-110\n", 2, "phase 'nan' is not a finite number" },
        { "infinite gain", H + "100,Infinity,-90\n200,30,-100\n", 2, "not a finite number" },
        { "decreasing frequency", H + "100,40,-90\n1000,20,-120\n500,30,-100\n", 4, "not above 1000 Hz on line 3" },
        { "repeated frequency", "100,40,-90\n100,39,-91\n", 2, "must rise strictly" },
        { "zero frequency", H + "0,40,-90\n100,30,-100\n", 2, "must be above 0" },
        { "negative frequency", "-100,40,-90\n100,30,-100\n", 1, "must be above 0" },
        { "semicolon in a comma file", H + "100,40,-90\n200;30;-100\n", 3, "a semicolon in a file separated by commas" },
        { "tab in a comma file", "100,40,-90\n200\t30\t-100\n", 2, "a tab in a file separated by commas" },
        { "semicolon in a tab file", "100\t40\t-90\n200;30;-100\n", 2, "a semicolon in a file separated by tabs" },
        { "tab in a semicolon file", "100;40;-90\n200;30\t-100\n", 2, "a tab in a file separated by semicolons" },
        { "missing phase without header", "100,40,-90\n200,30\n", 2, "the phase is missing" },
        { "missing phase with header", H + "100,40\n200,30,-100\n", 2, "the phase is missing" },
        { "header names no phase", "Frequency (Hz),Gain (dB)\n100,40\n", 1, "no phase (degrees) column" },
        { "header names no frequency", "Gain (dB),Phase (deg),Coherence\n40,-90,1\n", 1, "no frequency column" },
        { "four values and no header", "100,40,-90,0.99\n200,30,-100,0.98\n", 1, "4 values and no header" },
        { "extra value on a data line", H + "100,40,-90\n200,30,-100,7\n", 3, "4 values, expected 3" },
        { "SI prefix in a number", H + "100,40,-90\n1k,30,-100\n", 3, "frequency '1k' is not a number" },
        { "empty gain", H + "100,,-90\n200,30,-100\n", 2, "the gain is empty" },
        { "one data line", H + "100,40,-90\n", 2, "at least two" },
        { "header only", H, 1, "at least two" },
        { "no separator", "100 40 -90\n200 30 -100\n", 1, "no column separator" },
        { "phase in radians", "Frequency (Hz),Gain (dB),Phase (rad)\n100,40,-1.57\n200,30,-1.7\n", 1, "not radians" },
        { "linear gain", "Frequency (Hz),Gain (V/V),Phase (deg)\n100,100,-90\n200,30,-100\n", 1, "in dB" },
        { "two frequency columns", "Frequency (Hz),Frequency (kHz),Gain (dB),Phase (deg)\n100,0.1,40,-90\n", 1, "two frequency columns" },
        { "unnamed header column", "Frequency (Hz),Gain (dB),Phase (deg),\n100,40,-90,\n200,30,-100,\n", 1, "column 4 of the header has no name" },
        { "frequency in rad/s", "Frequency (rad/s),Gain (dB),Phase (deg)\n628,40,-90\n1256,30,-100\n", 1, "not rad/s" },
    };

    [Theory]
    [MemberData(nameof(Files))]
    public void Is_rejected_with_its_line_number_and_nothing_is_imported(string what, string text, int line, string fragment)
    {
        var result = MeasuredCsvReader.Read(text);
        Assert.False(result.Succeeded, what);
        Assert.Null(result.Response);
        Assert.NotEmpty(result.Errors);
        Assert.Contains(result.Errors, e => e.Line == line && e.Message.Contains(fragment, StringComparison.Ordinal));
    }

    [Fact]
    public void Invalid_utf8_bytes_are_rejected_as_binary_on_their_line()
    {
        byte[] bytes = [.. Encoding.ASCII.GetBytes("100,40,-90\n200,30,-100\n"), 0xFF, 0xFE, 0x00, 0x81];
        var result = MeasuredCsvReader.Read(bytes);
        Assert.Null(result.Response);
        var error = Assert.Single(result.Errors);
        Assert.Equal(3, error.Line);
        Assert.Contains("binary", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Every_error_of_a_file_is_listed_in_line_order()
    {
        var result = MeasuredCsvReader.Read(H + "100,40,-90\nx,30,-100\n300,NaN,-110\n400,20\n");
        Assert.Equal([3, 4, 5], result.Errors.Select(e => e.Line));
    }

    [Fact]
    public void Errors_stop_after_the_limit()
    {
        string text = H + string.Concat(Enumerable.Range(0, 100).Select(i => "x,1,2\n"));
        var result = MeasuredCsvReader.Read(text);
        Assert.Equal(MeasuredCsvReader.MaxErrors + 1, result.Errors.Length);
        Assert.Contains("stopped after", result.Errors[^1].Message, StringComparison.Ordinal);
    }
}
