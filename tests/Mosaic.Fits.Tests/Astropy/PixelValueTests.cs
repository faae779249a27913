using System.Text.Json;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Astropy;

/// <summary>Pixel values of astropy-written files, compared with what astropy.io.fits (Debian python3-astropy) reads.</summary>
[Collection(AstropyCollection.Name)]
public sealed class PixelValueTests(AstropyReferenceFiles files)
{
    /// <summary>Files where astropy's own arithmetic is exact, so every value must match bit for bit.</summary>
    public static TheoryData<string, int> ExactFiles => new()
    {
        { "bitpix8.fits", 0 }, { "bitpix16.fits", 0 }, { "bitpix32.fits", 0 }, { "bitpix64.fits", 0 },
        { "bitpix-32.fits", 0 }, { "bitpix-64.fits", 0 },
        // Power-of-two BSCALE keeps astropy's float32 arithmetic exact for 8/16 bits; 32/64 bits it does in float64.
        { "scaled8.fits", 0 }, { "scaled16.fits", 0 }, { "scaled32.fits", 0 }, { "scaled64.fits", 0 },
        { "uint16.fits", 0 }, { "uint32.fits", 0 }, { "uint64.fits", 0 }, { "int8.fits", 0 },
        { "blank16.fits", 0 }, { "blank32.fits", 0 },
        { "cube.fits", 0 }, { "header.fits", 0 }, { "mef.fits", 1 }, { "mef.fits", 4 }, { "groups.fits", 1 },
    };

    [Theory]
    [MemberData(nameof(ExactFiles))]
    public void WholePlaneMatchesAstropyAsFloat32(string name, int hdu)
    {
        var expected = Expected(name, hdu);
        using var file = FitsFile.Open(files.PathOf(name));
        var plane = file.Hdus[hdu].Image!;
        Assert.NotNull(plane);
        Assert.Equal(expected.GetProperty("width").GetInt32(), plane.Width);
        Assert.Equal(expected.GetProperty("height").GetInt32(), plane.Height);

        // astropy.io.fits (Debian python3-astropy): its physical values, cast to float32 by numpy (one rounding).
        var reference = Reference.Singles(expected.GetProperty("f32"));
        var actual = new float[plane.Width * plane.Height];
        plane.ReadRows(0, plane.Height, actual);
        AssertSameSingles(reference, actual, name);
    }

    [Theory]
    [MemberData(nameof(ExactFiles))]
    public void EveryValueMatchesAstropyInDoublePrecision(string name, int hdu)
    {
        var expected = Expected(name, hdu);
        using var file = FitsFile.Open(files.PathOf(name));
        var plane = file.Hdus[hdu].Image!;
        // astropy.io.fits (Debian python3-astropy): physical values as float64 (numpy's single rounding for 64-bit integers).
        var reference = Reference.Reals(expected.GetProperty("f64"));
        for (var y = 0; y < plane.Height; y++)
            for (var x = 0; x < plane.Width; x++)
            {
                var want = reference[y * plane.Width + x];
                var got = plane.ReadValue(x, y);
                Assert.True(Reference.SameDouble(want, got), $"{name} HDU {hdu} pixel ({x}, {y}): astropy {want:R}, Mosaic {got:R}");
            }
    }

    [Theory]
    [MemberData(nameof(ExactFiles))]
    public void RowSegmentsMatchAstropy(string name, int hdu)
    {
        var expected = Expected(name, hdu);
        using var file = FitsFile.Open(files.PathOf(name));
        var plane = file.Hdus[hdu].Image!;
        var reference = Reference.Singles(expected.GetProperty("f32"));
        // Segments at odd starts and lengths, so vector bodies and scalar tails both see unaligned data.
        foreach (var (y, x, n) in new[] { (0, 0, plane.Width), (1, 3, 37), (plane.Height - 1, 17, 50), (5, plane.Width - 1, 1), (7, 30, 0) })
        {
            var row = new float[n];
            plane.ReadRow(y, x, row);
            AssertSameSingles(reference.AsSpan(y * plane.Width + x, n).ToArray(), row, $"{name} row {y} from {x}");
        }
        var two = new float[2 * plane.Width];
        plane.ReadRows(plane.Height - 2, 2, two);
        AssertSameSingles(reference.AsSpan((plane.Height - 2) * plane.Width).ToArray(), two, $"{name} last two rows");
    }

    [Fact]
    public void ScaledFloat32MatchesAstropyWithinItsFloat32Arithmetic()
    {
        // astropy.io.fits (Debian python3-astropy) scales BITPIX -32 in float32 (two roundings); Mosaic in double
        // (one rounding), so the two may differ by one unit in the last place of a float.
        var expected = Expected("scaled-32.fits", 0);
        using var file = FitsFile.Open(files.PathOf("scaled-32.fits"));
        var plane = file.Hdus[0].Image!;
        var reference = Reference.Singles(expected.GetProperty("f32"));
        var actual = new float[plane.Width * plane.Height];
        plane.ReadRows(0, plane.Height, actual);
        for (var i = 0; i < reference.Length; i++)
        {
            if (float.IsNaN(reference[i])) { Assert.True(float.IsNaN(actual[i]), $"pixel {i} should be NaN"); continue; }
            var ulps = Math.Abs(BitConverter.SingleToInt32Bits(reference[i]) - BitConverter.SingleToInt32Bits(actual[i]));
            Assert.True(ulps <= 1, $"pixel {i}: astropy {reference[i]:R}, Mosaic {actual[i]:R}");
            Assert.Equal(reference[i], (float)plane.ReadValue(i % plane.Width, i / plane.Width), 1e-6f * Math.Abs(reference[i]) + 1e-30f);
        }
    }

    [Fact]
    public void BlankPixelsAreMaskedLikeAstropy()
    {
        // astropy.io.fits (Debian python3-astropy) returns NaN where the stored value equals BLANK (FITS 4.0 section 4.4.2.5).
        foreach (var name in new[] { "blank16.fits", "blank32.fits" })
        {
            var reference = Reference.Reals(Expected(name, 0).GetProperty("f64"));
            var masked = Enumerable.Range(0, reference.Length).Where(i => double.IsNaN(reference[i])).ToArray();
            Assert.Equal(3, masked.Length);
            using var file = FitsFile.Open(files.PathOf(name));
            var plane = (RawImagePlane)file.Hdus[0].Image!;
            Assert.NotNull(plane.Blank);
            foreach (var i in masked) Assert.True(double.IsNaN(plane.ReadValue(i % plane.Width, i / plane.Width)));
        }
    }

    [Fact]
    public void FloatNaNIsKeptAndFloat64BeyondFloatRangeIsInfinite()
    {
        // numpy (Debian python3-numpy) float64 -> float32 cast gives inf for 1e300; astropy keeps NaN pixels as NaN.
        using var file = FitsFile.Open(files.PathOf("bitpix-64.fits"));
        var row = new float[file.Hdus[0].Image!.Width];
        file.Hdus[0].Image!.ReadRow(0, 0, row);
        Assert.True(float.IsNaN(row[5]));
        Assert.True(float.IsPositiveInfinity(row[6]));
        Assert.Equal(1.0 + Math.Pow(2, -40), file.Hdus[0].Image!.ReadValue(7, 0));
    }

    private JsonElement Expected(string name, int hdu) => files.Hdus(name)[hdu].GetProperty("image");

    private static void AssertSameSingles(float[] expected, float[] actual, string what)
    {
        Assert.Equal(expected.Length, actual.Length);
        for (var i = 0; i < expected.Length; i++)
            Assert.True(Reference.SameSingle(expected[i], actual[i]), $"{what}, index {i}: astropy {expected[i]:R}, Mosaic {actual[i]:R}");
    }
}
