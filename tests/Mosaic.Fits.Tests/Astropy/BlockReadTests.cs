using System.Text.Json;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Astropy;

/// <summary>
/// Block reads (a box of rows in one call, upward or downward) of astropy-written files: the same values astropy.io.fits
/// (Debian python3-astropy) reads, and the same as a plain row-by-row read of the same box.
/// </summary>
[Collection(AstropyCollection.Name)]
public sealed class BlockReadTests(AstropyReferenceFiles files)
{
    public static TheoryData<string, int> ExactFiles => PixelValueTests.ExactFiles;

    /// <summary>Boxes (x, y, width, rows, step) at odd offsets and sizes, the whole plane both ways, and single rows and columns.</summary>
    private static IEnumerable<(int X, int Y, int Width, int Rows, int Step)> Boxes(ImagePlane plane) =>
    [
        (0, 0, plane.Width, plane.Height, 1),
        (0, plane.Height - 1, plane.Width, plane.Height, -1),
        (3, 2, 37, 5, 1),
        (plane.Width - 17, plane.Height - 1, 17, Math.Min(6, plane.Height), -1),
        (plane.Width - 1, 0, 1, plane.Height, 1),
        (5, plane.Height / 2, 1, 1, -1),
    ];

    [Theory]
    [MemberData(nameof(ExactFiles))]
    public void BlocksMatchAstropyAndRowByRowReads(string name, int hdu)
    {
        var expected = Expected(name, hdu);
        using var file = FitsFile.Open(files.PathOf(name));
        var plane = file.Hdus[hdu].Image!;
        // astropy.io.fits (Debian python3-astropy): physical values (BSCALE/BZERO applied, BLANK as NaN where scaled),
        // cast to float32 by numpy; row 0 is FITS y = 1.
        var reference = Reference.Singles(expected.GetProperty("f32"));
        foreach (var (x, y, width, rows, step) in Boxes(plane))
        {
            var block = new float[width * rows];
            plane.ReadBlock(x, y, width, rows, step, block);
            var row = new float[width];
            for (var j = 0; j < rows; j++)
            {
                var fitsRow = y + j * step;
                plane.ReadRow(fitsRow, x, row);
                for (var i = 0; i < width; i++)
                {
                    var where = $"{name} HDU {hdu} box ({x}, {y}, {width} x {rows}, step {step}) pixel ({x + i}, {fitsRow})";
                    var got = block[j * width + i];
                    var want = reference[fitsRow * plane.Width + x + i];
                    Assert.True(Reference.SameSingle(want, got), $"{where}: astropy {want:R}, block {got:R}");
                    Assert.True(Reference.SameSingle(row[i], got), $"{where}: row read {row[i]:R}, block {got:R}");
                }
            }
        }
    }

    [Fact]
    public void ScaledFloat32BlocksMatchAstropyWithinItsFloat32Arithmetic()
    {
        // astropy.io.fits (Debian python3-astropy) scales BITPIX -32 in float32 (two roundings), Mosaic in double (one):
        // at most one unit in the last place apart. The block must equal the row read exactly (one decoder).
        using var file = FitsFile.Open(files.PathOf("scaled-32.fits"));
        var plane = file.Hdus[0].Image!;
        var reference = Reference.Singles(Expected("scaled-32.fits", 0).GetProperty("f32"));
        var block = new float[plane.Width * plane.Height];
        plane.ReadBlock(0, plane.Height - 1, plane.Width, plane.Height, -1, block);
        var row = new float[plane.Width];
        for (var j = 0; j < plane.Height; j++)
        {
            var y = plane.Height - 1 - j;
            plane.ReadRow(y, 0, row);
            for (var i = 0; i < plane.Width; i++)
            {
                var got = block[j * plane.Width + i];
                var want = reference[y * plane.Width + i];
                Assert.True(Reference.SameSingle(row[i], got), $"pixel ({i}, {y}): row read {row[i]:R}, block {got:R}");
                if (float.IsNaN(want)) { Assert.True(float.IsNaN(got), $"pixel ({i}, {y}) should be NaN"); continue; }
                var ulps = Math.Abs(BitConverter.SingleToInt32Bits(want) - BitConverter.SingleToInt32Bits(got));
                Assert.True(ulps <= 1, $"pixel ({i}, {y}): astropy {want:R}, block {got:R}");
            }
        }
    }

    [Fact]
    public void BlankAndNaNPixelsAreMaskedInBlocks()
    {
        // astropy.io.fits (Debian python3-astropy): NaN where a scaled stored value equals BLANK (FITS 4.0 section
        // 4.4.2.5), and stored float NaN kept; the reference files hold three BLANK pixels and one NaN.
        foreach (var (name, count) in new[] { ("blank16.fits", 3), ("bitpix-32.fits", 1), ("bitpix-64.fits", 1) })
        {
            var reference = Reference.Singles(Expected(name, 0).GetProperty("f32"));
            using var file = FitsFile.Open(files.PathOf(name));
            var plane = file.Hdus[0].Image!;
            var block = new float[plane.Width * plane.Height];
            plane.ReadBlock(0, plane.Height - 1, plane.Width, plane.Height, -1, block);
            var masked = 0;
            for (var j = 0; j < plane.Height; j++)
                for (var i = 0; i < plane.Width; i++)
                {
                    var want = float.IsNaN(reference[(plane.Height - 1 - j) * plane.Width + i]);
                    Assert.Equal(want, float.IsNaN(block[j * plane.Width + i]));
                    if (want) masked++;
                }
            Assert.Equal(count, masked);
        }
    }

    [Fact]
    public void BoxesOutsideThePlaneAndBadStepsAreRejected()
    {
        using var file = FitsFile.Open(files.PathOf("bitpix16.fits"));
        var p = file.Hdus[0].Image!;
        var big = new float[p.Width * p.Height];
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, 0, p.Width + 1, 1, 1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(p.Width - 3, 0, 4, 1, 1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(-1, 0, 2, 1, 1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, p.Height - 2, 3, 3, 1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, 1, 3, 3, -1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, p.Height, 3, 1, 1, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, 0, 3, 2, 0, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, 0, 3, 2, 2, big));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadBlock(0, 0, 3, 2, 1, new float[5]));
        // An empty box reads nothing and touches nothing.
        var untouched = new[] { 7f };
        p.ReadBlock(0, 0, 0, 5, 1, untouched);
        p.ReadBlock(0, 0, 5, 0, 1, untouched);
        Assert.Equal(7f, untouched[0]);
    }

    private JsonElement Expected(string name, int hdu) => files.Hdus(name)[hdu].GetProperty("image");
}
