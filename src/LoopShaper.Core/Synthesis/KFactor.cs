namespace LoopShaper.Core.Synthesis;

/// <summary>
/// Venable's K factor (H. D. Venable, "The K Factor: A New Mathematical Tool for Stability Analysis and Synthesis",
/// Proc. Powercon 10, 1983): the spread between the zeros and the poles of a Type II or Type III compensator that gives
/// a required phase boost at the crossover, with the crossover at their geometric mean.
/// </summary>
public static class KFactor
{
    /// <summary>A Type II compensator (one zero, one pole) gives less than 90 degrees of boost.</summary>
    public const double TypeIIMaxBoostDeg = 90.0;

    /// <summary>A Type III compensator (double zero, double pole) gives less than 180 degrees of boost.</summary>
    public const double TypeIIIMaxBoostDeg = 180.0;

    /// <summary>Required boost at the crossover: boost = PM - 90 - phase(plant(fc)), degrees (the integrator gives -90; Venable 1983).</summary>
    public static double RequiredBoostDeg(double phaseMarginDeg, double plantPhaseDeg) => phaseMarginDeg - 90.0 - plantPhaseDeg;

    /// <summary>Type II: K = tan(boost/2 + 45 deg); zero at fc / K, pole at fc K (Venable 1983).</summary>
    public static double TypeII(double boostDeg) => Math.Tan(Radians((boostDeg / 2.0) + 45.0));

    /// <summary>Type III: K = tan^2(boost/4 + 45 deg); double zero at fc / sqrt(K), double pole at fc sqrt(K) (Venable 1983).</summary>
    public static double TypeIII(double boostDeg)
    {
        double t = Math.Tan(Radians((boostDeg / 4.0) + 45.0));
        return t * t;
    }

    /// <summary>
    /// The boost a Type II pair gives at the geometric mean of its zero and pole: atan(K) - atan(1/K), degrees; the
    /// inverse of <see cref="TypeII"/>.
    /// </summary>
    public static double TypeIIBoostDeg(double k) => Degrees(Math.Atan(k) - Math.Atan(1.0 / k));

    /// <summary>The boost of a Type III double pair: 2 (atan(sqrt K) - atan(1/sqrt K)), degrees; the inverse of <see cref="TypeIII"/>.</summary>
    public static double TypeIIIBoostDeg(double k) => 2.0 * Degrees(Math.Atan(Math.Sqrt(k)) - Math.Atan(1.0 / Math.Sqrt(k)));

    private static double Radians(double deg) => deg * Math.PI / 180.0;

    private static double Degrees(double rad) => rad * 180.0 / Math.PI;
}
