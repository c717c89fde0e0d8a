namespace LoopShaper.Web.Model;

/// <summary>
/// Moves the compensator's poles, zeros and gain: a logarithmic slider position for frequencies, and keyboard nudges
/// (a fiftieth of a decade, or a tenth with Shift; a quarter dB, or one dB with Shift, for a mid-band gain).
/// </summary>
public static class Placement
{
    /// <summary>Slider positions from one end to the other.</summary>
    public const int SliderSteps = 1000;

    /// <summary>The field a target edits.</summary>
    public static FieldState FieldOf(DesignForm form, PlacementTarget target) => target switch
    {
        PlacementTarget.Gain => form.GainValue,
        PlacementTarget.Zero1 => form.Zero1,
        PlacementTarget.Zero2 => form.Zero2,
        PlacementTarget.Pole1 => form.Pole1,
        _ => form.Pole2,
    };

    /// <summary>What the engineer calls a target; the gain by what fixes it.</summary>
    public static string NameOf(DesignForm form, PlacementTarget target) => target switch
    {
        PlacementTarget.Gain => form.GainKind switch
        {
            LoopShaper.Core.Compensators.GainSettingKind.CrossoverHz => "Crossover target",
            LoopShaper.Core.Compensators.GainSettingKind.IntegratorHz => "Integrator frequency fi",
            _ => "Mid-band gain",
        },
        _ => FieldOf(form, target).Label,
    };

    /// <summary>The target that edits a field, or null.</summary>
    public static PlacementTarget? TargetOf(DesignForm form, FieldState field)
        => Enum.GetValues<PlacementTarget>().Cast<PlacementTarget?>().FirstOrDefault(t => ReferenceEquals(FieldOf(form, t!.Value), field));

    /// <summary>True when the target is a frequency (moved on a log scale), false for a gain in dB.</summary>
    public static bool IsFrequency(DesignForm form, PlacementTarget target) => !(target == PlacementTarget.Gain && form.GainValue.Unit == "dB");

    /// <summary>Slider range of a frequency target: the analysed range (with a fallback when it is unreadable).</summary>
    public static (double Min, double Max) FrequencyRange(DesignForm form)
    {
        double lo = form.StartFrequency.Value ?? 10, hi = form.StopFrequency.Value ?? 1e6;
        return lo > 0 && hi > lo && double.IsFinite(hi) ? (lo, hi) : (10, 1e6);
    }

    /// <summary>Slider range of a mid-band gain, dB.</summary>
    public static (double Min, double Max) GainRangeDb => (-40, 60);

    /// <summary>Slider position of a value.</summary>
    public static int ToSlider(double value, (double Min, double Max) range, bool logarithmic)
    {
        if (!double.IsFinite(value))
        {
            return SliderSteps / 2;
        }

        double u = logarithmic
            ? Math.Log(Math.Max(value, range.Min) / range.Min) / Math.Log(range.Max / range.Min)
            : (value - range.Min) / (range.Max - range.Min);
        return (int)Math.Round(Math.Clamp(u, 0, 1) * SliderSteps);
    }

    /// <summary>The value at a slider position.</summary>
    public static double FromSlider(int position, (double Min, double Max) range, bool logarithmic)
    {
        double u = Math.Clamp(position, 0, SliderSteps) / (double)SliderSteps;
        return logarithmic ? range.Min * Math.Pow(range.Max / range.Min, u) : range.Min + (u * (range.Max - range.Min));
    }

    /// <summary>Nudges a target by <paramref name="steps"/> (positive: up in frequency or gain); returns false when its value is unreadable.</summary>
    public static bool Nudge(DesignForm form, PlacementTarget target, int steps, bool coarse)
    {
        var field = FieldOf(form, target);
        if (field.Value is not double v || !double.IsFinite(v))
        {
            return false;
        }

        if (IsFrequency(form, target))
        {
            if (v <= 0)
            {
                return false;
            }

            double decades = steps * (coarse ? 0.1 : 0.02);
            field.SetValue(v * Math.Pow(10, decades));
        }
        else
        {
            field.SetValue(v + (steps * (coarse ? 1.0 : 0.25)));
        }

        return true;
    }
}
