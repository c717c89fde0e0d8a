using System.Globalization;
using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Core.PlantModels;

namespace LoopShaper.Cli.Tests;

/// <summary>Numbers are read and written culture-invariant (shared/CONVENTIONS.md), even on a machine with a decimal comma.</summary>
public class CultureTests
{
    [Fact]
    public async Task Under_a_decimal_comma_culture_every_output_still_uses_points()
    {
        var saved = CultureInfo.CurrentCulture;
        var savedUi = CultureInfo.CurrentUICulture;
        try
        {
            var german = CultureInfo.GetCultureInfo("de-DE");
            Assert.Equal(",", german.NumberFormat.NumberDecimalSeparator);
            CultureInfo.CurrentCulture = german;
            CultureInfo.CurrentUICulture = german;
            Assert.Equal("0,5", 0.5.ToString(CultureInfo.CurrentCulture));

            string example = RepoFiles.Example("core-rail-12v-to-1v0.json");

            var text = await CliRun.Of("analyze", example);
            Assert.NotEqual(2, text.ExitCode); // read and analysed; 0 or 1 depends on the corner table, not on the culture

            Assert.Contains("phase margin                63.4 deg at 56.5 kHz", text.Output, StringComparison.Ordinal);
            Assert.DoesNotContain("63,4", text.Output, StringComparison.Ordinal);

            var json = await CliRun.Of("analyze", example, "--format", "json");
            using (var doc = JsonDocument.Parse(json.Output))
            {
                Assert.Equal(63.4, doc.RootElement.GetProperty("margins").GetProperty("phaseMarginDeg").GetDouble(), 0.05);
            }

            var bode = await CliRun.Of("bode", example);
            foreach (var line in bode.Output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Skip(1))
            {
                Assert.Equal(7, line.Split(',').Length);
                Assert.Contains('.', line);
            }

            // Reading: "0.3 mOhm" and 1.0 are not taken as thousands or decimal commas.
            var design = DesignFile.Read(File.ReadAllText(example)).Design!;
            var stage = ((BuckPlant)design.Plant).PowerStage;
            Assert.Equal(0.3e-3, stage.Inductor.DcrOhm, 1e-18);
            Assert.Equal(1.0, stage.OutputVoltageV);
            string written = DesignFile.Write(design);
            Assert.Contains("\"outputVoltageV\": 1,", written, StringComparison.Ordinal);
            Assert.Contains("\"maxDutyCycle\": 0.9", written, StringComparison.Ordinal);
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
            CultureInfo.CurrentUICulture = savedUi;
        }
    }
}
