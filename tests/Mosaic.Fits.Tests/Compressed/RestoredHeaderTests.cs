using System.Text.Json;

namespace Mosaic.Fits.Tests.Compressed;

/// <summary>
/// The header of a compressed HDU is the image's own (FITS 4.0 section 10.1.1, table 35: the Z keywords renamed
/// back, the table's structure and compression keywords gone), as astropy.io.fits CompImageHDU.header and funpack
/// (Debian libcfitsio-bin) restore it.
/// </summary>
[Collection(FpackCollection.Name)]
public sealed class RestoredHeaderTests(FpackReferenceFiles files)
{
    [Theory]
    [InlineData("i16_rice")]
    [InlineData("u16_rice")]
    [InlineData("s32_rice")]
    [InlineData("f32_dither1")]
    [InlineData("f64_lossless_gzip2")]
    public void KeywordsMatchAstropyAndFunpack(string name)
    {
        var astropy = files.HeaderOf(name);
        using var file = FitsFile.Open(files.PathOf(name));
        var hdu = file.Hdus.Single(h => h.Image is not null);
        using var unpacked = FitsFile.Open(files.UnpackedPath(name));
        var funpack = unpacked.Hdus.First(h => h.Image is not null).Header;

        foreach (var keyword in new[] { "SIMPLE", "XTENSION", "BITPIX", "NAXIS", "NAXIS1", "NAXIS2", "PCOUNT", "GCOUNT",
                     "EXTNAME", "BLANK", "BSCALE", "BZERO", "BUNIT", "OBSLABEL" })
        {
            var has = astropy.TryGetProperty(keyword, out var want);
            Assert.True(has == hdu.Header.Contains(keyword), $"{name}: astropy {(has ? "has" : "lacks")} {keyword}");
            if (!has) continue;
            var got = hdu.Header.Find(keyword)!.Value;
            switch (want.ValueKind)
            {
                case JsonValueKind.String: Assert.Equal(want.GetString()!.TrimEnd(), ((string)got!).TrimEnd()); break;
                case JsonValueKind.True or JsonValueKind.False: Assert.Equal(want.GetBoolean(), got); break;
                default: Assert.Equal(want.GetDouble(), Convert.ToDouble(got)); break;
            }
            // funpack writes the same card into the image it unpacks (a primary HDU where ZSIMPLE was given).
            if (keyword is not ("PCOUNT" or "GCOUNT" or "XTENSION" or "SIMPLE"))
                Assert.Equal(Convert.ToString(funpack.Find(keyword)!.Value)!.TrimEnd(), Convert.ToString(got)!.TrimEnd());
        }

        // Nothing of the table or of the compression is left (section 10.1.1).
        foreach (var card in hdu.Header.Cards.Where(c => !c.IsCommentary))
        {
            Assert.False(card.Keyword.StartsWith('Z'), $"{name}: {card.Keyword} was not restored");
            Assert.False(card.Keyword is "TFIELDS" or "THEAP" || card.Keyword.StartsWith("TFORM") || card.Keyword.StartsWith("TTYPE"),
                $"{name}: table keyword {card.Keyword} left in the image header");
        }
        Assert.NotSame(hdu.Header, hdu.StoredHeader);
        Assert.Equal("BINTABLE", hdu.StoredHeader.GetString("XTENSION")?.TrimEnd());
        Assert.Equal(hdu.Image!.BitPix, hdu.Header.GetLong("BITPIX"));
    }

    [Fact]
    public void ChecksumOfTheOriginalImageIsRestoredUnderItsName()
    {
        // Section 10.1.1: ZHECKSUM and ZDATASUM hold the original CHECKSUM and DATASUM. fpack writes them when the
        // source carries checksums, so this source is written with them by astropy (checksum=True).
        var path = Path.Combine(files.FolderPath, "summed.fits");
        Mosaic.Testing.DebianPython.RunCode("""
import sys, numpy as np
from astropy.io import fits
fits.PrimaryHDU(np.arange(300, dtype=np.int16).reshape(15, 20)).writeto(sys.argv[1], checksum=True, overwrite=True)
""", [path]);
        var packed = Path.Combine(files.FolderPath, "summed.fz");
        var result = Mosaic.Testing.ExternalProgram.Run("/usr/bin/fpack", ["-O", packed, path]);
        Assert.Equal(0, result.ExitCode);
        using var original = FitsFile.Open(path);
        using var file = FitsFile.Open(packed);
        var stored = file.Hdus[1].StoredHeader;
        Assert.True(stored.Contains("ZHECKSUM") && stored.Contains("ZDATASUM"), "fpack did not keep the original checksums");
        var header = file.Hdus[1].Header;
        Assert.Equal(stored.GetString("ZDATASUM"), header.GetString("DATASUM"));
        Assert.Equal(stored.GetString("ZHECKSUM"), header.GetString("CHECKSUM"));
        Assert.Equal(original.Hdus[0].Header.GetString("DATASUM"), header.GetString("DATASUM"));
    }
}
