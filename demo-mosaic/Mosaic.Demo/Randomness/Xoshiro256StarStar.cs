using System.Numerics;

namespace Mosaic.Demo.Randomness;

/// <summary>
/// xoshiro256** (Blackman &amp; Vigna 2018, "Scrambled linear pseudorandom number generators"), seeded through
/// SplitMix64 as its authors recommend. Each (seed, stream, indices) key gives an independent generator, so a chip's
/// pixels never depend on which thread drew them or in what order.
/// </summary>
internal sealed class Xoshiro256StarStar
{
    private ulong _s0, _s1, _s2, _s3;

    private Xoshiro256StarStar(ulong seed)
    {
        var sm = seed;
        _s0 = SplitMix64(ref sm);
        _s1 = SplitMix64(ref sm);
        _s2 = SplitMix64(ref sm);
        _s3 = SplitMix64(ref sm);
    }

    /// <summary>A generator for one named stream of the field, optionally for one band and one chip.</summary>
    public static Xoshiro256StarStar For(long seed, RandomStream stream, int first = -1, int second = -1)
    {
        var key = (ulong)seed;
        key = Mix(key ^ (ulong)stream);
        key = Mix(key ^ (ulong)(uint)first);
        key = Mix(key ^ ((ulong)(uint)second << 32));
        return new Xoshiro256StarStar(key);
    }

    public ulong NextUInt64()
    {
        var result = BitOperations.RotateLeft(_s1 * 5, 7) * 9;
        var t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = BitOperations.RotateLeft(_s3, 45);
        return result;
    }

    /// <summary>Uniform in [0, 1) with 53 random bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));

    public double Uniform(double low, double high) => low + (high - low) * NextDouble();

    /// <summary>Uniform integer in [0, count).</summary>
    public int NextInt(int count)
    {
        if (count <= 0) throw new ArgumentOutOfRangeException(nameof(count), count, "count must be positive.");
        return (int)((NextUInt64() >> 32) * (ulong)count >> 32);
    }

    /// <summary>Standard normal deviate (Box–Muller), for catalogue draws; pixel noise uses <see cref="GaussianNoise"/>.</summary>
    public double NextGaussian()
    {
        var u1 = 1.0 - NextDouble();
        var u2 = NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }

    private static ulong SplitMix64(ref ulong state)
    {
        state += 0x9E3779B97F4A7C15UL;
        return Mix(state);
    }

    private static ulong Mix(ulong z)
    {
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
