namespace Mosaic.Fits.Pixels;

/// <summary>BSCALE, BZERO and BLANK of one image (FITS 4.0 sections 4.4.2.5 and 5.3), resolved once per plane.</summary>
internal readonly struct SampleScaling
{
    private const double TwoPow63 = 9223372036854775808.0;

    public SampleScaling(int bitPix, double bScale, double bZero, long? blank)
    {
        BScale = bScale;
        BZero = bZero;
        var integral = bZero == Math.Floor(bZero) && Math.Abs(bZero) <= TwoPow63;
        Mode = bScale == 1 && bZero == 0 ? ScalingMode.Identity
            : bScale == 1 && integral && bitPix > 0 ? ScalingMode.IntegerOffset
            : ScalingMode.General;
        IntegerZero = Mode == ScalingMode.IntegerOffset ? (Int128)bZero : 0;

        // BLANK applies to integer data only; a BLANK outside the stored type's range can never match.
        var (min, max) = bitPix switch
        {
            8 => (0L, 255L),
            16 => (short.MinValue, short.MaxValue),
            32 => (int.MinValue, int.MaxValue),
            64 => (long.MinValue, long.MaxValue),
            _ => (1L, 0L),
        };
        HasBlank = blank is long b && b >= min && b <= max;
        Blank = HasBlank ? blank!.Value : 0;
    }

    public double BScale { get; }
    public double BZero { get; }
    public ScalingMode Mode { get; }

    /// <summary>BZERO as an exact integer when <see cref="Mode"/> is <see cref="ScalingMode.IntegerOffset"/>.</summary>
    public Int128 IntegerZero { get; }

    public bool HasBlank { get; }
    public long Blank { get; }
}
