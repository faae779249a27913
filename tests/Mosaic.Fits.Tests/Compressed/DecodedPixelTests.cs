namespace Mosaic.Fits.Tests.Compressed;

/// <summary>
/// Every pixel of every fpack case, bit for bit, against funpack's output (Debian libcfitsio-bin, the reference
/// implementation of FITS 4.0 section 10) and against astropy.io.fits CompImageHDU (Debian python3-astropy).
/// </summary>
[Collection(FpackCollection.Name)]
public sealed class DecodedPixelTests(FpackReferenceFiles files)
{
    public static TheoryData<string> CaseNames()
    {
        var data = new TheoryData<string>();
        foreach (var c in FpackReferenceFiles.Cases) data.Add(c.Name);
        return data;
    }

    public static TheoryData<string> AstropyCaseNames()
    {
        var data = new TheoryData<string>();
        foreach (var c in FpackReferenceFiles.Cases.Where(c => c.AstropyReads)) data.Add(c.Name);
        return data;
    }

    internal static (FitsFile File, TiledImagePlane Plane) Open(string path)
    {
        var file = FitsFile.Open(path);
        var hdu = file.Hdus.Single(h => h.Image is not null);
        Assert.True(hdu.IsTileCompressed);
        return (file, Assert.IsType<TiledImagePlane>(hdu.Image));
    }

    [Theory]
    [MemberData(nameof(CaseNames))]
    public void EveryValueMatchesFunpackBitForBit(string name)
    {
        var c = FpackReferenceFiles.Case(name);
        var reference = files.Reference(c);
        var sourceNaN = files.SourceNaN(c);
        var (file, plane) = Open(files.PathOf(name));
        using (file)
        {
            Assert.Equal(reference.Length, (long)plane.Width * plane.Height);
            for (var y = 0; y < plane.Height; y++)
                for (var x = 0; x < plane.Width; x++)
                {
                    var i = (long)y * plane.Width + x;
                    var want = c.FunpackReads || !sourceNaN[i] ? reference[i] : double.NaN;
                    var got = plane.ReadValue(x, y);
                    if (double.IsNaN(want)) { if (!double.IsNaN(got)) Assert.Fail($"{name} ({x + 1}, {y + 1}): want NaN, got {got}"); }
                    else if (BitConverter.DoubleToInt64Bits(want) != BitConverter.DoubleToInt64Bits(got))
                        Assert.Fail($"{name} ({x + 1}, {y + 1}): the reference gives {want:R}, read {got:R}");
                }
        }
    }

    [Theory]
    [MemberData(nameof(CaseNames))]
    public void RowsMatchFunpackAndTheUnpackedFile(string name)
    {
        var c = FpackReferenceFiles.Case(name);
        var reference = files.Reference(c);
        var sourceNaN = files.SourceNaN(c);
        var (file, plane) = Open(files.PathOf(name));
        using var unpacked = FitsFile.Open(files.UnpackedPath(name));
        using (file)
        {
            var raw = unpacked.Hdus.First(h => h.Image is not null).Image!;
            Assert.Equal(plane.BitPix, raw.BitPix);
            var rows = new float[plane.Width * plane.Height];
            var rawRows = new float[rows.Length];
            plane.ReadRows(0, plane.Height, rows);
            raw.ReadRows(0, raw.Height, rawRows);
            for (var i = 0; i < rows.Length; i++)
            {
                // The same rows through the uncompressed reader (itself checked against astropy in PixelValueTests).
                if (c.FunpackReads && !rows[i].Equals(rawRows[i])) Assert.Fail($"{name} pixel {i}: {rows[i]:R} vs unpacked {rawRows[i]:R}");
                var want = c.FunpackReads || !sourceNaN[i] ? (float)reference[i] : float.NaN;
                if (!rows[i].Equals(want)) Assert.Fail($"{name} pixel {i}: {rows[i]:R} vs reference {want:R}");
            }
        }
    }

    [Theory]
    [MemberData(nameof(AstropyCaseNames))]
    public void AstropyCompImageHduReadsTheSameValues(string name)
    {
        var reference = files.AstropyCompressed(name);
        var sourceNaN = files.SourceNaN(FpackReferenceFiles.Case(name));
        var (file, plane) = Open(files.PathOf(name));
        using (file)
        {
            var i = 0;
            for (var y = 0; y < plane.Height; y++)
                for (var x = 0; x < plane.Width; x++, i++)
                {
                    var got = plane.ReadValue(x, y);
                    var want = sourceNaN[i] ? double.NaN : reference[i];
                    if (!(double.IsNaN(want) ? double.IsNaN(got) : want.Equals(got)))
                        Assert.Fail($"{name} ({x + 1}, {y + 1}): astropy gives {want:R}, read {got:R}");
                }
        }
    }
}
