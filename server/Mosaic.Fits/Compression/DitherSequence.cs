namespace Mosaic.Fits.Compression;

/// <summary>
/// The 10000 uniform random numbers of subtractive dithering (FITS 4.0 section 10.2.1): the Park–Miller generator
/// (a = 16807, m = 2^31 - 1) from seed 1, each value seed / m rounded to single precision.
/// </summary>
internal static class DitherSequence
{
    public const int Length = 10000;

    public static readonly float[] Values = Build();

    private static float[] Build()
    {
        var values = new float[Length];
        const double a = 16807.0, m = 2147483647.0;
        var seed = 1.0;
        for (var i = 0; i < Length; i++)
        {
            // Computed in double exactly as the standard gives it: a * seed < 2^46 is exact, and so is the remainder.
            var temp = a * seed;
            seed = temp - m * (int)(temp / m);
            values[i] = (float)(seed / m);
        }
        // Section 10.2.1: the 10000th seed must be 1043618065, else the arithmetic above is not the standard's.
        if (seed != 1043618065.0) throw new InvalidOperationException($"dither generator self-check failed: seed {seed}");
        return values;
    }
}
