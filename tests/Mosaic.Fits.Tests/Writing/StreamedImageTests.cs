using System.Buffers.Binary;
using System.Text.Json;
using Mosaic.Fits.Tests.Support;
using Mosaic.Fits.Writing;
using Mosaic.Testing;

namespace Mosaic.Fits.Tests.Writing;

/// <summary>
/// FitsWriter.BeginImage and FitsImageData: data written a strip at a time, read back by astropy.io.fits (Debian
/// python3-astropy); StoredSamples and CardCheck, which cutouts use to copy an image's samples and cards.
/// </summary>
public sealed class StreamedImageTests
{
    /// <summary>The value both sides compute for pixel (i, j), 0-based column and row.</summary>
    private static short Sample(int i, int j) => (short)(i * 7 + j * 311 - 20000);

    [Fact]
    public void StripsOfTwoImagesReadBackThroughAstropy()
    {
        using var folder = new TempFolder();
        var path = folder.File("strips.fits");
        const int Width = 37, Height = 23;
        using (var stream = File.Create(path))
        using (var writer = new FitsWriter(stream))
        {
            var ints = writer.BeginImage([new HeaderCard("BZERO", 32768L, null), new HeaderCard("EXTNAME", "INTS", null)], 16, [Width, Height]);
            var row = new byte[Width * 2];
            // A row at a time, as a streaming cutout sends them.
            for (var j = 0; j < Height; j++)
            {
                for (var i = 0; i < Width; i++) BinaryPrimitives.WriteInt16BigEndian(row.AsSpan(i * 2), Sample(i, j));
                ints.WriteBigEndian(row);
            }
            Assert.Equal(ints.ExpectedBytes, ints.WrittenBytes);
            ints.Complete();

            var floats = writer.BeginImage([new HeaderCard("EXTNAME", "FLOATS", null)], -32, [Width, Height]);
            var values = Enumerable.Range(0, Width * Height).Select(k => k * 0.25f - 3f).ToArray();
            floats.WriteFloats(values.AsSpan(0, 5));
            floats.WriteFloats(values.AsSpan(5, 400));
            floats.WriteFloats(values.AsSpan(405));
            floats.Complete();
        }
        // FITS 4.0 section 3.3.2: every HDU padded to whole 2880-byte blocks.
        Assert.Equal(0, new FileInfo(path).Length % 2880);

        var json = DebianPython.RunCode("""
            import json, sys
            import numpy as np
            from astropy.io import fits
            with fits.open(sys.argv[1], do_not_scale_image_data=True) as f:
                f.verify("exception")
                j, i = np.mgrid[0:23, 0:37]
                expected = (i * 7 + j * 311 - 20000).astype(np.int16)
                ints = f[0].data
                floats = f[1].data
                print(json.dumps({"hdus": len(f), "intsEqual": bool(np.array_equal(ints, expected)), "intsType": str(ints.dtype),
                                  "bzero": f[0].header["BZERO"], "names": [h.header.get("EXTNAME") for h in f],
                                  "floatsEqual": bool(np.array_equal(floats.ravel(), np.arange(37 * 23) * 0.25 - 3.0))}))
            """, [path]);
        var r = JsonDocument.Parse(json).RootElement;
        Assert.Equal(2, r.GetProperty("hdus").GetInt32());
        Assert.True(r.GetProperty("intsEqual").GetBoolean());
        Assert.Equal(">i2", r.GetProperty("intsType").GetString());
        Assert.Equal(32768, r.GetProperty("bzero").GetInt32());
        Assert.Equal(["INTS", "FLOATS"], r.GetProperty("names").EnumerateArray().Select(e => e.GetString()));
        Assert.True(r.GetProperty("floatsEqual").GetBoolean());
    }

    [Fact]
    public void TheDataMustMatchWhatTheHeaderDeclares()
    {
        using var stream = new MemoryStream();
        using var writer = new FitsWriter(stream, leaveOpen: true);
        var data = writer.BeginImage([], 16, [4, 2]);                  // 16 bytes
        data.WriteBigEndian(new byte[10]);
        Assert.Throws<InvalidOperationException>(() => data.Complete());   // 10 of 16
        Assert.Throws<ArgumentException>(() => data.WriteBigEndian(new byte[8]));   // would be 18
        Assert.Throws<InvalidOperationException>(() => data.WriteFloats(new float[1]));   // not BITPIX -32
        // No other HDU while this one's data are open.
        Assert.Throws<InvalidOperationException>(() => writer.BeginImage([], 8, [1, 1]));
        data.WriteBigEndian(new byte[6]);
        data.Complete();
        Assert.Throws<InvalidOperationException>(() => data.Complete());
        // Header (one block) and data padded to one block: FITS 4.0 section 3.3.2.
        Assert.Equal(2 * 2880, stream.Length);
        writer.BeginImage([], 8, [1, 1]).WriteBigEndian(new byte[1]);
    }

    [Fact]
    public void StoredSamplesAreTheFilesBytesBeforeScaling()
    {
        using var folder = new TempFolder();
        var path = folder.File("scaled.fits");
        // astropy writes uint16 data as BITPIX 16 with BZERO 32768 (FITS 4.0 section 5.3, table 11).
        var rows = DebianPython.RunCode("""
            import sys
            import numpy as np
            from astropy.io import fits
            data = (np.arange(6 * 9, dtype=np.uint32).reshape(6, 9) * 1201 % 65536).astype(np.uint16)
            fits.PrimaryHDU(data).writeto(sys.argv[1])
            with fits.open(sys.argv[1], do_not_scale_image_data=True) as f:
                print(f[0].data[4, 2:7].astype(">i2").tobytes().hex())
            """, [path]).Trim();
        using var file = FitsFile.Open(path);
        var plane = Assert.IsType<RawImagePlane>(file.Hdus[0].Image);
        var bytes = new byte[5 * 2];
        StoredSamples.ReadRow(plane, 4, 2, bytes);
        Assert.Equal(rows, Convert.ToHexStringLower(bytes));
        Assert.Throws<ArgumentOutOfRangeException>(() => StoredSamples.ReadRow(plane, 4, 6, new byte[8]));   // past the width
        Assert.Throws<ArgumentException>(() => StoredSamples.ReadRow(plane, 4, 0, new byte[3]));             // half a sample
    }

    [Fact]
    public void CardCheckKeepsWhatTheWriterCanWriteAndShortensOverlongComments()
    {
        var plain = new HeaderCard("EXPTIME", 30.0, "seconds");
        Assert.Same(plain, CardCheck.Writable(plain));
        // Structure the writer writes itself, and HIERARCH-style names (FITS 4.0 section 4.1.2.1 allows A-Z, 0-9, _ and -).
        Assert.Null(CardCheck.Writable(new HeaderCard("NAXIS1", 10L, null)));
        Assert.Null(CardCheck.Writable(new HeaderCard("PIPELINE STEP", "flatten", null)));
        // 1.5E-05 right-justified ends in column 30; " / " and a 60-character comment would need 93 columns.
        var comment = new string('c', 60);
        var shortened = CardCheck.Writable(new HeaderCard("EXPLEN", 1.5e-05, comment));
        Assert.NotNull(shortened);
        Assert.StartsWith(shortened!.Comment!, comment);
        var record = CardImages.UserRecords(shortened)[0];
        Assert.Equal(80, record.Length);
        Assert.Equal('c', record[79]);     // the comment fills the card to its last column
        Assert.Equal(47, shortened.Comment!.Length);
    }
}
