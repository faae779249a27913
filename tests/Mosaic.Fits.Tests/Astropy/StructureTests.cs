using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Astropy;

/// <summary>HDU boundaries and kinds, compared with astropy.io.fits (Debian python3-astropy) fileinfo().</summary>
[Collection(AstropyCollection.Name)]
public sealed class StructureTests(AstropyReferenceFiles files)
{
    [Fact]
    public void EveryFileHasTheHdusAstropyFinds()
    {
        foreach (var name in files.Names)
        {
            var expected = files.Hdus(name);
            using var file = FitsFile.Open(files.PathOf(name));
            Assert.Equal(expected.GetArrayLength(), file.Hdus.Count);
            for (var i = 0; i < file.Hdus.Count; i++)
            {
                var want = expected[i];
                var hdu = file.Hdus[i];
                var where = $"{name} HDU {i}";
                // astropy.io.fits fileinfo(): hdrLoc, datLoc, datSpan (data plus padding to 2880).
                Assert.True(want.GetProperty("header_offset").GetInt64() == hdu.HeaderOffset, where + " header offset");
                Assert.True(want.GetProperty("data_offset").GetInt64() == hdu.DataOffset, where + " data offset");
                Assert.True(want.GetProperty("data_span").GetInt64() == (hdu.DataLength + 2879) / 2880 * 2880, where + " data span");
                Assert.Equal(Reference.OptionalString(want, "xtension"), hdu.XTension);
                Assert.Equal(Reference.OptionalString(want, "extname"), hdu.ExtName);
                Assert.Equal(want.GetProperty("image").ValueKind != System.Text.Json.JsonValueKind.Null, hdu.Image is not null);
            }
        }
    }

    [Fact]
    public void TablesBetweenImagesAreSkippedUsingPcountAndGcount()
    {
        using var file = FitsFile.Open(files.PathOf("mef.fits"));
        // astropy.io.fits (Debian python3-astropy) wrote a BINTABLE with a variable-length column, whose heap
        // makes PCOUNT > 0 (FITS 4.0 section 7.3.5); the image after it is only found if the heap is skipped.
        var table = file.Hdus[2];
        Assert.Equal("BINTABLE", table.XTension);
        Assert.True(table.Header.GetLong("PCOUNT") > 0);
        Assert.Equal(table.Header.GetLong("NAXIS1")!.Value * table.Header.GetLong("NAXIS2")!.Value + table.Header.GetLong("PCOUNT")!.Value,
            table.DataLength);
        Assert.Null(table.Image);
        Assert.Equal("TABLE", file.Hdus[3].XTension);
        Assert.Equal("SCI2", file.Hdus[4].ExtName);
        Assert.Equal(16, file.Hdus[4].Image!.BitPix);
    }

    [Fact]
    public void RandomGroupsAndOneDimensionalArraysHaveNoPlane()
    {
        using var groups = FitsFile.Open(files.PathOf("groups.fits"));
        // FITS 4.0 section 6: random groups have NAXIS1 = 0 and size |BITPIX| x GCOUNT x (PCOUNT + NAXIS2 x ... x NAXISm).
        Assert.Equal(0, groups.Hdus[0].Header.GetLong("NAXIS1"));
        Assert.Null(groups.Hdus[0].Image);
        Assert.Equal(4L * 3 * (2 + 5 * 4 * 1), groups.Hdus[0].DataLength);
        Assert.Equal("AFTER", groups.Hdus[1].ExtName);
        using var vector = FitsFile.Open(files.PathOf("vector.fits"));
        Assert.Null(vector.Hdus[0].Image);
        Assert.Equal(20, vector.Hdus[0].DataLength);
    }

    [Fact]
    public void CubeServesItsFirstPlane()
    {
        using var file = FitsFile.Open(files.PathOf("cube.fits"));
        var hdu = file.Hdus[0];
        Assert.Equal(3, hdu.Header.GetLong("NAXIS"));
        Assert.Equal(3, hdu.Header.GetLong("NAXIS3"));
        // astropy.io.fits: data[0] is the first plane; the full data (3 planes) is what DataLength counts.
        Assert.Equal(3L * 67 * 13 * 4, hdu.DataLength);
        Assert.Equal(hdu.DataOffset, ((RawImagePlane)hdu.Image!).DataOffset);
    }
}
