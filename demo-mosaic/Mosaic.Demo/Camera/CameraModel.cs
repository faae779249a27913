using Mosaic.Demo.Defects;
using Mosaic.Demo.Randomness;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Camera;

/// <summary>
/// The camera as a whole: a grid of chips on one focal plane with gaps and small mounting errors, a pixel scale, and
/// a radial distortion of the optics, D = F (1 + k |F|²) about the boresight. Each chip's TAN-SIP header is this same
/// model seen from the chip's own pixel frame, so chip WCSs agree with each other exactly.
/// </summary>
internal sealed class CameraModel
{
    public const double PixelScaleArcsec = 0.25;
    public const double CornerDistortionPixels = 4.0;
    public const int InverseSipOrder = 4;
    private const double MaxRotationDegrees = 0.06;

    private CameraModel(SkyCoordinate boresight, double fieldWidth, double fieldHeight, double radialK, IReadOnlyList<ChipLayout> chips)
    {
        Boresight = boresight;
        FieldWidth = fieldWidth;
        FieldHeight = fieldHeight;
        RadialK = radialK;
        Chips = chips;
    }

    public SkyCoordinate Boresight { get; }

    /// <summary>Size of the whole array on the focal plane, gaps included, in pixels.</summary>
    public double FieldWidth { get; }

    public double FieldHeight { get; }

    public double RadialK { get; }

    public IReadOnlyList<ChipLayout> Chips { get; }

    public static double DegreesPerPixel => PixelScaleArcsec / 3600.0;

    public static CameraModel Build(DemoFieldOptions options, SkyCoordinate boresight)
    {
        var w = options.ChipWidth;
        var h = options.ChipHeight;
        var gap = options.GapPixels;
        var fieldWidth = options.ChipColumns * (double)w + (options.ChipColumns - 1) * gap;
        var fieldHeight = options.ChipRows * (double)h + (options.ChipRows - 1) * gap;
        var cornerRadius = Math.Sqrt(fieldWidth * fieldWidth + fieldHeight * fieldHeight) / 2;
        // "A few pixels at the field corners": the displacement k r³ there is CornerDistortionPixels.
        var k = CornerDistortionPixels / (cornerRadius * cornerRadius * cornerRadius);

        var rng = Xoshiro256StarStar.For(options.Seed, RandomStream.Camera);
        var maxOffset = Math.Min(4.0, gap / 10.0);
        var chips = new ChipLayout[options.ChipCount];
        for (var row = 0; row < options.ChipRows; row++)
        for (var column = 0; column < options.ChipColumns; column++)
        {
            var index = row * options.ChipColumns + column;
            var cx = -fieldWidth / 2 + column * (double)(w + gap) + w / 2.0 + rng.Uniform(-maxOffset, maxOffset);
            var cy = -fieldHeight / 2 + row * (double)(h + gap) + h / 2.0 + rng.Uniform(-maxOffset, maxOffset);
            var rotation = Math.Round(rng.Uniform(-MaxRotationDegrees, MaxRotationDegrees), 5);
            var gain = Math.Round(1.5 * (1 + rng.Uniform(-0.02, 0.02)), 3);
            var readNoise = Math.Round(rng.Uniform(3.4, 4.8), 2);
            var fullWell = 90_000 * (1 + rng.Uniform(-0.03, 0.03));
            var saturate = (long)Math.Floor(fullWell / gain);
            var placement = new ChipPlacement(w, h, cx, cy, rotation);
            var (wcs, residual) = Describe(placement, boresight, k);
            chips[index] = new ChipLayout(index, column, row, placement, gain, readNoise, saturate,
                ChipDefects.Draw(options.Seed, index, w, h), wcs, residual);
        }
        return new CameraModel(boresight, fieldWidth, fieldHeight, k, chips);
    }

    /// <summary>The sky position of an undistorted focal-plane point (pixels from the boresight).</summary>
    public SkyCoordinate FocalPlaneToSky(double x, double y)
    {
        var stretch = 1 + RadialK * (x * x + y * y);
        // East is left: ξ grows towards −x.
        return Gnomonic.ToSky(Boresight, -DegreesPerPixel * x * stretch, DegreesPerPixel * y * stretch);
    }

    /// <summary>
    /// In the chip frame, F = R(θ)(u, v) with (u, v) the offset from the boresight's chip pixel, so |F| = |(u, v)| and
    /// the radial term is A = k u (u² + v²), B = k v (u² + v²); CD is the global scale and parity times R(θ).
    /// </summary>
    private static (TanSipWcs Wcs, double InverseResidual) Describe(ChipPlacement chip, SkyCoordinate boresight, double radialK)
    {
        var origin = chip.FromFocalPlane(0, 0);
        var (sin, cos) = Math.SinCos(chip.RotationDegrees * Math.PI / 180.0);
        var s = DegreesPerPixel;

        var a = new double[4, 4];
        var b = new double[4, 4];
        a[3, 0] = radialK; a[1, 2] = radialK;
        b[2, 1] = radialK; b[0, 3] = radialK;
        var forwardA = new SipPolynomial(3, a);
        var forwardB = new SipPolynomial(3, b);

        // Fit the inverse a little beyond the chip so positions just off its edge stay accurate too.
        const double margin = 16;
        var fit = SipInverseFit.Fit(forwardA, forwardB, InverseSipOrder,
            -0.5 - margin - origin.X, chip.Width - 0.5 + margin - origin.X,
            -0.5 - margin - origin.Y, chip.Height - 0.5 + margin - origin.Y);

        var wcs = new TanSipWcs(boresight, origin.X + 1, origin.Y + 1, -s * cos, s * sin, s * sin, s * cos,
            forwardA, forwardB, fit.Ap, fit.Bp);
        return (wcs, fit.MaxResidualPixels);
    }
}
