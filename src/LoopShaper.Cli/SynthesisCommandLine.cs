using System.CommandLine;
using LoopShaper.Core.Design;
using LoopShaper.Core.Synthesis;

namespace LoopShaper.Cli;

/// <summary>
/// The options that steer a component synthesis, shared by `synthesize` and `export`: --series, --cap-series, --r1,
/// --no-search, --search-steps. Each overrides the design file's synthesis section (docs/design-file.md).
/// </summary>
internal sealed class SynthesisCommandLine
{
    private readonly Option<string?> _series = new("--series") { Description = "Resistor series: E24, E48, E96 or E192 (IEC 60063). Default: the design's synthesis.resistorSeries, else E96." };
    private readonly Option<string?> _capSeries = new("--cap-series") { Description = "Capacitor series: E6, E12 or E24 (IEC 60063). Default: the design's synthesis.capacitorSeries, else E12." };
    private readonly Option<string?> _r1 = new("--r1") { Description = "R1, the input resistor and divider top, with SI prefix (10k, 49.9 kOhm). Default: the design's synthesis.r1Ohm, else plant.feedback.topOhm." };
    private readonly Option<bool> _noSearch = new("--no-search") { Description = "Keep the nearest preferred values; skip the search over neighbouring values." };
    private readonly Option<string?> _searchSteps = new("--search-steps") { Description = "Width of the neighbour search: preferred-value steps up and down per part, 1 to 3. Default: the design's synthesis.searchSteps, else 2." };

    /// <summary>Smallest and largest --search-steps (as synthesis.searchSteps, NetworkSynthesizer).</summary>
    private const int MinSearchSteps = 1, MaxSearchSteps = 3;

    /// <summary>Adds the options to a command.</summary>
    public void AddTo(Command command)
    {
        command.Options.Add(_series);
        command.Options.Add(_capSeries);
        command.Options.Add(_r1);
        command.Options.Add(_noSearch);
        command.Options.Add(_searchSteps);
    }

    /// <summary>The design's synthesis options with the command line's overrides; false after writing the errors.</summary>
    public bool TryOptions(ParseResult parse, LoopDesign design, TextWriter error, out SynthesisOptions options)
    {
        options = DesignSynthesizer.OptionsOf(design);
        bool ok = TrySeries(parse.GetValue(_series), "--series", "resistors", SynthesisOptions.ResistorSeriesAllowed, error, out var resistors)
            & TrySeries(parse.GetValue(_capSeries), "--cap-series", "capacitors", SynthesisOptions.CapacitorSeriesAllowed, error, out var capacitors)
            & CommandLineValues.TryRead(parse.GetValue(_r1), "--r1", "Ohm", 1, 1e9, error, out double? r1)
            & TrySteps(parse.GetValue(_searchSteps), error, out int? steps);
        if (!ok)
        {
            return false;
        }

        options = options with
        {
            ResistorSeries = resistors ?? options.ResistorSeries,
            CapacitorSeries = capacitors ?? options.CapacitorSeries,
            R1Ohm = r1 ?? options.R1Ohm,
            SearchNeighbours = options.SearchNeighbours && !parse.GetValue(_noSearch),
            SearchSteps = steps ?? options.SearchSteps,
        };
        return true;
    }

    /// <summary>An optional whole number of search steps, 1 to 3; false after writing "error: --search-steps: ...".</summary>
    private static bool TrySteps(string? text, TextWriter error, out int? steps)
    {
        steps = null;
        if (text is null)
        {
            return true;
        }

        if (!int.TryParse(text.Trim(), System.Globalization.NumberStyles.Integer, System.Globalization.CultureInfo.InvariantCulture, out int n))
        {
            error.WriteLine($"error: --search-steps: '{text}' is not a whole number: allowed {MinSearchSteps} to {MaxSearchSteps}.");
            return false;
        }

        if (n is < MinSearchSteps or > MaxSearchSteps)
        {
            error.WriteLine($"error: --search-steps: {n} is out of range: allowed {MinSearchSteps} to {MaxSearchSteps}.");
            return false;
        }

        steps = n;
        return true;
    }

    private static bool TrySeries(string? text, string option, string kind, IReadOnlyList<ESeries> allowed, TextWriter error, out ESeries? series)
    {
        series = null;
        if (text is null)
        {
            return true;
        }

        string offered = string.Join(", ", allowed);
        if (!StandardValues.TryParse(text, out var s, out string message))
        {
            error.WriteLine($"error: {option}: {message} For {kind}: {offered}.");
            return false;
        }

        if (!allowed.Contains(s))
        {
            error.WriteLine($"error: {option}: {s} is not offered for {kind}: allowed {offered}.");
            return false;
        }

        series = s;
        return true;
    }
}
