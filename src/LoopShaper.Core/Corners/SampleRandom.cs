namespace LoopShaper.Core.Corners;

/// <summary>
/// The random numbers of one Monte Carlo sample: a SplitMix64 stream (Steele, Lea and Flood, "Fast Splittable
/// Pseudorandom Number Generators", OOPSLA 2014) whose state is derived from (seed, sample index) alone, so a sample is
/// the same whichever thread draws it and in whatever order. Normal draws by the Box-Muller transform (Box and Muller,
/// Ann. Math. Statist. 29, 1958).
/// </summary>
public struct SampleRandom
{
    private const ulong Golden = 0x9E3779B97F4A7C15UL;
    private ulong _state;

    /// <summary>The stream of sample <paramref name="index"/> of a run with <paramref name="seed"/>.</summary>
    public SampleRandom(ulong seed, long index)
    {
        _state = Mix(seed ^ Mix((ulong)index * Golden + Golden));
    }

    /// <summary>The next 64 random bits.</summary>
    public ulong NextBits()
    {
        _state += Golden;
        return Mix(_state);
    }

    /// <summary>A uniform draw in [0, 1) with 53 random bits.</summary>
    public double NextUniform() => (NextBits() >> 11) * (1.0 / (1UL << 53));

    /// <summary>A standard normal draw (Box-Muller, the cosine branch).</summary>
    public double NextNormal()
    {
        double u1 = 1.0 - NextUniform();
        double u2 = NextUniform();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }

    private static ulong Mix(ulong z)
    {
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
