namespace Mosaic.Demo.Nebulae;

/// <summary>
/// Lattice value noise: a hashed random value at each integer lattice point, blended with the quintic fade
/// 6t⁵ − 15t⁴ + 10t³ so the field and its slope are continuous. Octave sums give fractal (fBm) and ridged variants.
/// </summary>
internal sealed class ValueNoise
{
    private readonly ulong _seed;

    public ValueNoise(ulong seed) => _seed = seed;

    /// <summary>Smooth noise in [0, 1) with unit lattice spacing.</summary>
    public double Sample(double x, double y)
    {
        var fx = Math.Floor(x);
        var fy = Math.Floor(y);
        var ix = (long)fx;
        var iy = (long)fy;
        var tx = Fade(x - fx);
        var ty = Fade(y - fy);
        var v00 = Lattice(ix, iy);
        var v10 = Lattice(ix + 1, iy);
        var v01 = Lattice(ix, iy + 1);
        var v11 = Lattice(ix + 1, iy + 1);
        var bottom = v00 + (v10 - v00) * tx;
        var top = v01 + (v11 - v01) * tx;
        return bottom + (top - bottom) * ty;
    }

    /// <summary>Fractal sum of octaves (lacunarity 2, gain 0.5), normalised back to [0, 1).</summary>
    public double Fractal(double x, double y, int octaves)
    {
        double sum = 0, amplitude = 1, norm = 0, frequency = 1;
        for (var o = 0; o < octaves; o++)
        {
            // Each octave is shifted so lattice points of different octaves do not line up.
            sum += amplitude * Sample(x * frequency + 17.13 * o, y * frequency - 11.71 * o);
            norm += amplitude;
            amplitude *= 0.5;
            frequency *= 2;
        }
        return sum / norm;
    }

    /// <summary>Ridged octave sum in [0, 1]: sharp crests where the noise crosses its middle, like filaments.</summary>
    public double Ridged(double x, double y, int octaves)
    {
        double sum = 0, amplitude = 1, norm = 0, frequency = 1, weight = 1;
        for (var o = 0; o < octaves; o++)
        {
            var n = Sample(x * frequency + 31.7 * o, y * frequency + 7.3 * o);
            var ridge = 1 - Math.Abs(2 * n - 1);
            ridge *= ridge;
            // Finer octaves are strongest on the crests of coarser ones, which keeps the filaments connected.
            ridge *= weight;
            weight = Math.Clamp(ridge * 1.5, 0, 1);
            sum += amplitude * ridge;
            norm += amplitude;
            amplitude *= 0.5;
            frequency *= 2;
        }
        return sum / norm;
    }

    private static double Fade(double t) => t * t * t * (t * (t * 6 - 15) + 10);

    private double Lattice(long ix, long iy)
    {
        var h = _seed ^ ((ulong)ix * 0x9E3779B97F4A7C15UL) ^ ((ulong)iy * 0xC2B2AE3D27D4EB4FUL);
        h = (h ^ (h >> 30)) * 0xBF58476D1CE4E5B9UL;
        h = (h ^ (h >> 27)) * 0x94D049BB133111EBUL;
        h ^= h >> 31;
        return (h >> 11) * (1.0 / (1UL << 53));
    }
}
