using System.Numerics;

namespace Mosaic.Demo.Rendering;

/// <summary>
/// Photon and read noise, then electrons → ADU: e + √(max(e, 0) + σ_read²) · z, divided by the gain. Shot noise uses the
/// Gaussian approximation with variance equal to the signal (accurate for the hundreds of electrons of sky);
/// pixels at or above SATURATE become NaN, and NaN stays NaN.
/// </summary>
internal static class DetectorNoise
{
    public static void Apply(Span<float> row, ReadOnlySpan<float> gaussian, float readNoiseElectrons, float gain, float saturateAdu)
    {
        var n = Vector<float>.Count;
        var readVariance = readNoiseElectrons * readNoiseElectrons;
        var invGain = 1f / gain;
        var vRead = new Vector<float>(readVariance);
        var vInvGain = new Vector<float>(invGain);
        var vSaturate = new Vector<float>(saturateAdu);
        var vNaN = new Vector<float>(float.NaN);
        var i = 0;
        for (; i <= row.Length - n; i += n)
        {
            var e = new Vector<float>(row[i..]);
            var sigma = Vector.SquareRoot(Vector.Max(e, Vector<float>.Zero) + vRead);
            var adu = (e + sigma * new Vector<float>(gaussian[i..])) * vInvGain;
            Vector.ConditionalSelect(Vector.GreaterThanOrEqual(adu, vSaturate), vNaN, adu).CopyTo(row[i..]);
        }
        for (; i < row.Length; i++)
        {
            var e = row[i];
            var adu = (e + MathF.Sqrt(MathF.Max(e, 0) + readVariance) * gaussian[i]) * invGain;
            row[i] = adu >= saturateAdu ? float.NaN : adu;
        }
    }
}
