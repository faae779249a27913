namespace Mosaic.Fits.Pixels;

internal enum ScalingMode
{
    /// <summary>BSCALE = 1, BZERO = 0.</summary>
    Identity,

    /// <summary>BSCALE = 1 and an integral BZERO: physical values are exact integers (the unsigned conventions).</summary>
    IntegerOffset,

    /// <summary>Anything else: BZERO + BSCALE * stored in double.</summary>
    General,
}
