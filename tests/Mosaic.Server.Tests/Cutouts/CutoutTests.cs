using System.Globalization;
using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Cutouts;

/// <summary>
/// GET /api/fields/{field}/cutout.fits, read back by outside FITS readers: astropy.io.fits and astropy.wcs (Debian
/// python3-astropy) and CFITSIO's imcopy/funpack (libcfitsio-bin).
/// </summary>
public sealed class CutoutTests(CutoutFixture fixture) : IClassFixture<CutoutFixture>
{
    private static string Text(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    [Fact]
    public async Task Int16ChipWithBzeroKeepsItsStoredValuesScalingAndWcs()
    {
        var (path, response) = await fixture.Download("chips/cutout.fits?hdu=CHIP1&x0=3&y0=2&x1=60&y1=45");
        var r = CutoutFixture.Check(fixture.ChipsPath, 1, path, 3, 2);

        Assert.True(r.GetProperty("verified").GetBoolean(), r.ToString());      // astropy verify('exception')
        Assert.Equal(1, r.GetProperty("hdus").GetInt32());
        // Same BITPIX, BZERO, BSCALE and BLANK as the source (FITS 4.0 sections 4.4.2.5 and 5.3), so the stored
        // integers are a byte-for-byte slice of astropy's unscaled array.
        Assert.Equal(16, r.GetProperty("bitpix").GetInt32());
        Assert.Equal(32768, r.GetProperty("cut_BZERO").GetInt32());
        Assert.Equal(-32768, r.GetProperty("cut_BLANK").GetInt32());
        Assert.True(r.GetProperty("rawEqual").GetBoolean());
        Assert.True(r.GetProperty("valuesEqual").GetBoolean());
        Assert.Equal(">i2", r.GetProperty("dtype").GetString());
        Assert.Equal([44, 58], r.GetProperty("shape").EnumerateArray().Select(e => e.GetInt32()));
        // The fixture set FITS pixel (8, 6) to the BLANK value: the cutout carries it, and its BLANK card.
        Assert.Equal(1, r.GetProperty("blankCount").GetInt32());

        // WCS Paper I section 2.1.2: pixel p of the cutout is pixel p + origin - 1 of the source, so CRPIX moves by
        // the origin; SIP (Shupe et al. 2005) is relative to CRPIX and unchanged. astropy.wcs (wcslib) agrees.
        Assert.Equal(r.GetProperty("src_CRPIX1").GetDouble() - 2, r.GetProperty("cut_CRPIX1").GetDouble(), 12);
        Assert.Equal(r.GetProperty("src_CRPIX2").GetDouble() - 1, r.GetProperty("cut_CRPIX2").GetDouble(), 12);
        Assert.Equal(r.GetProperty("src_LTV1").GetDouble() - 2, r.GetProperty("cut_LTV1").GetDouble(), 12);   // IRAF LTV: common practice
        Assert.True(r.GetProperty("sip").GetBoolean());
        Assert.True(r.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9, r.GetProperty("maxSkyDiffDeg").ToString());

        Assert.Equal("CHIP1", r.GetProperty("cut_EXTNAME").GetString());
        Assert.Equal("adu", r.GetProperty("cut_BUNIT").GetString());
        // A checksum of the source would be wrong for the cutout; DATE is the cutout's own (FITS 4.0 section 4.4.2.1).
        Assert.Equal(JsonValueKind.Null, r.GetProperty("cut_CHECKSUM").ValueKind);
        Assert.NotEqual(JsonValueKind.Null, r.GetProperty("src_CHECKSUM").ValueKind);
        var date = DateTime.ParseExact(r.GetProperty("cut_DATE").GetString()!, "yyyy-MM-dd'T'HH:mm:ss", CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal);
        Assert.True(Math.Abs((DateTime.UtcNow - date).TotalMinutes) < 10, $"DATE {date:o}");
        var history = string.Join("\n", r.GetProperty("history").EnumerateArray().Select(e => e.GetString()));
        Assert.Contains("field 'chips'", history);
        Assert.Contains("'chips.fits', HDU 1 ('CHIP1')", history);
        Assert.Contains("x 3..60, y 2..45", history);

        Assert.Equal("application/fits", response.Content.Headers.ContentType?.MediaType);
        Assert.Equal("attachment", response.Content.Headers.ContentDisposition?.DispositionType);
        Assert.EndsWith(".fits", response.Content.Headers.ContentDisposition?.FileName?.Trim('"'));
        Assert.Equal(new FileInfo(path).Length, response.Content.Headers.ContentLength);
    }

    [Fact]
    public async Task Float32ChipKeepsItsValuesNanAndOwnCards()
    {
        var (path, _) = await fixture.Download("chips/cutout.fits?hdu=CHIP2&x0=3&y0=2&x1=60&y1=45");
        var r = CutoutFixture.Check(fixture.ChipsPath, 2, path, 3, 2);
        Assert.True(r.GetProperty("verified").GetBoolean(), r.ToString());
        Assert.Equal(-32, r.GetProperty("bitpix").GetInt32());
        Assert.True(r.GetProperty("rawEqual").GetBoolean());
        Assert.True(r.GetProperty("valuesEqual").GetBoolean());
        Assert.Equal(1, r.GetProperty("maskedCount").GetInt32());   // the fixture's NaN at FITS (12, 11)
        Assert.True(r.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9);
        // The source's own cards stay (the value as astropy reads it back); HIERARCH cards are left out (see README).
        Assert.Equal(1.5e-05, r.GetProperty("cut_EXPLEN").GetDouble());
        Assert.False(r.GetProperty("hierarch").GetBoolean());
    }

    [Fact]
    public async Task FpackedChipsComeOutUncompressedWithCfitsiosValues()
    {
        // Integers keep ZBITPIX and their scaling; quantised floats become BITPIX -32 with the restored values.
        // The reference is funpack's decompression (CFITSIO, the compression's reference code).
        var (ints, _) = await fixture.Download("packed/cutout.fits?hdu=1&x0=3&y0=2&x1=60&y1=45");
        var i = CutoutFixture.Check(fixture.UnpackedPath, 1, ints, 3, 2);
        Assert.True(i.GetProperty("verified").GetBoolean(), i.ToString());
        Assert.Equal(16, i.GetProperty("bitpix").GetInt32());
        Assert.Equal(32768, i.GetProperty("cut_BZERO").GetInt32());
        Assert.True(i.GetProperty("rawEqual").GetBoolean());
        Assert.True(i.GetProperty("valuesEqual").GetBoolean());
        Assert.True(i.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9);
        Assert.True(i.GetProperty("sip").GetBoolean());

        var (floats, _) = await fixture.Download("packed/cutout.fits?hdu=CHIP2&x0=3&y0=2&x1=60&y1=45");
        var f = CutoutFixture.Check(fixture.UnpackedPath, 2, floats, 3, 2);
        Assert.True(f.GetProperty("verified").GetBoolean(), f.ToString());
        Assert.Equal(-32, f.GetProperty("bitpix").GetInt32());
        Assert.True(f.GetProperty("valuesEqual").GetBoolean(), f.ToString());
        Assert.Equal(1, f.GetProperty("maskedCount").GetInt32());
        Assert.True(f.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9);
    }

    [Fact]
    public async Task CfitsioCopiesASectionOfTheCutoutWithTheSameValuesAndSky()
    {
        var (path, _) = await fixture.Download("chips/cutout.fits?hdu=CHIP1&x0=10&y0=20&x1=49&y1=59");
        var section = Path.Combine(fixture.Work, $"section-{Guid.NewGuid():N}.fits");
        // CFITSIO's extended file name syntax: a section [x0:x1,y0:y1]; imcopy writes it with the WCS it shifts itself.
        var copy = ExternalProgram.Run("/usr/bin/imcopy", [path + "[5:24,3:17]", section]);
        Assert.True(copy.ExitCode == 0, $"imcopy (libcfitsio-bin) could not read the cutout: {copy.Stderr}");
        var r = CutoutFixture.Check(path, 0, section, 5, 3);
        Assert.True(r.GetProperty("verified").GetBoolean(), r.ToString());
        Assert.True(r.GetProperty("rawEqual").GetBoolean());
        Assert.Equal(16, r.GetProperty("bitpix").GetInt32());
        Assert.True(r.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9, r.ToString());
    }

    [Fact]
    public async Task SkyPositionCutoutIsCentredOnAstropysPixel()
    {
        // The sky position of CHIP1 pixel (57.3, 41.8) by astropy's all_pix2world (SIP included).
        var (ra, dec) = SkyOf(1, 57.3, 41.8);
        var (path, response) = await fixture.Download($"chips/cutout.fits?ra={Text(ra)}&dec={Text(dec)}&size=10");
        var box = Box(response);
        var r = CutoutFixture.Check(fixture.ChipsPath, 1, path, box[0], box[1], Text(ra), Text(dec));
        Assert.Equal("CHIP1", r.GetProperty("cut_EXTNAME").GetString());
        Assert.True(r.GetProperty("rawEqual").GetBoolean());
        var cut = r.GetProperty("cutPixel").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var source = r.GetProperty("sourcePixel").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        // all_world2pix in the cutout and in the source name the same pixel, shifted by the box origin.
        Assert.Equal(source[0], cut[0] + box[0] - 1, 6);
        Assert.Equal(source[1], cut[1] + box[1] - 1, 6);
        Assert.Equal(57.3, source[0], 6);
        int width = box[2] - box[0] + 1, height = box[3] - box[1] + 1;
        // 10 arcsec at the fixture's 0.4 arcsec/pixel (its CD matrix; SIP moves the local scale by well under 4%).
        Assert.InRange(width, 24, 26);
        Assert.InRange(height, 24, 26);
        // Centred to half a pixel: the position lies within half a pixel of the box centre.
        Assert.True(Math.Abs(cut[0] - (width + 1) / 2.0) <= 0.5, $"x {cut[0]} in {width}");
        Assert.True(Math.Abs(cut[1] - (height + 1) / 2.0) <= 0.5, $"y {cut[1]} in {height}");

        // Typed position and hdu=canvas find the same chip and box.
        var typed = await fixture.Client.GetAsync($"/api/fields/chips/cutout.fits?position={Uri.EscapeDataString($"{Text(ra)} {Text(dec)}")}&size=10&hdu=canvas");
        Assert.Equal(HttpStatusCode.OK, typed.StatusCode);
        Assert.Equal(box, Box(typed));
    }

    [Fact]
    public async Task SkyCutoutReachingPastTheEdgeIsClipped()
    {
        var (ra, dec) = SkyOf(1, 2.0, 3.0);
        var (path, response) = await fixture.Download($"chips/cutout.fits?ra={Text(ra)}&dec={Text(dec)}&size=10,6");
        var box = Box(response);
        Assert.Equal(1, box[0]);
        Assert.Equal(1, box[1]);
        var r = CutoutFixture.Check(fixture.ChipsPath, 1, path, box[0], box[1]);
        Assert.True(r.GetProperty("rawEqual").GetBoolean());
        Assert.Contains(r.GetProperty("history").EnumerateArray(), h => h.GetString()!.Contains("cut there", StringComparison.Ordinal));
        Assert.True(r.GetProperty("maxSkyDiffDeg").GetDouble() < 1e-9);
    }

    [Fact]
    public async Task CanvasCutoutIsFloat32WithTheBilinearValuesOfTheChips()
    {
        var (path, _) = await fixture.Download("chips/cutout.fits?hdu=canvas&x0=5&y0=5&x1=200&y1=80");
        var r = CutoutFixture.Check(path, 0, path, 1, 1);
        Assert.True(r.GetProperty("verified").GetBoolean(), r.ToString());
        Assert.Equal(-32, r.GetProperty("bitpix").GetInt32());
        Assert.Equal("CANVAS", r.GetProperty("cut_EXTNAME").GetString());
        Assert.Equal("adu", r.GetProperty("cut_BUNIT").GetString());
        Assert.Contains(r.GetProperty("history").EnumerateArray(), h => h.GetString()!.Contains("resampled", StringComparison.Ordinal));
        Assert.Contains(r.GetProperty("history").EnumerateArray(), h => h.GetString()!.Contains("bilinear", StringComparison.Ordinal));

        // astropy.wcs + numpy: each pixel's sky position on the chips, bilinear there, to 0.01 px of the local
        // gradient (the canvas's documented accuracy goal); NaN off every chip.
        var check = JsonDocument.Parse(DebianPython.RunFile(SkyDataFixture.Script("cutout_canvas_check.py"), [fixture.ChipsPath, path])).RootElement;
        Assert.True(check.GetProperty("checked").GetInt32() > 8000, check.ToString());
        Assert.True(check.GetProperty("worstRatio").GetDouble() <= 1.0, check.ToString());
        Assert.Equal(check.GetProperty("outside").GetInt32(), check.GetProperty("nanOutside").GetInt32());
    }

    [Fact]
    public async Task BoxesOverTheLimitAreRefusedNamingTheSize()
    {
        // 200 x 101 = 20200 pixels over the fixture's limit of 20000.
        var box = await fixture.Client.GetAsync("/api/fields/chips/cutout.fits?hdu=canvas&x0=1&y0=1&x1=200&y1=101");
        Assert.Equal(HttpStatusCode.RequestEntityTooLarge, box.StatusCode);
        var problem = await box.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal("x0,y0,x1,y1", problem.GetProperty("parameter").GetString());
        Assert.Contains("20200", problem.GetProperty("detail").GetString());

        var (ra, dec) = SkyOf(1, 60, 45);
        var sky = await fixture.Client.GetAsync($"/api/fields/chips/cutout.fits?ra={Text(ra)}&dec={Text(dec)}&size=100");
        Assert.Equal(HttpStatusCode.RequestEntityTooLarge, sky.StatusCode);
        Assert.Equal("size", (await sky.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
    }

    [Theory]
    [InlineData("chips/cutout.fits?hdu=1&x0=abc&y0=1&x1=2&y1=2", 400, "x0")]
    [InlineData("chips/cutout.fits?hdu=1&x0=1&y0=1&x1=500&y1=2", 400, "x1")]
    [InlineData("chips/cutout.fits?hdu=1&x0=0&y0=1&x1=5&y1=2", 400, "x0")]
    [InlineData("chips/cutout.fits?hdu=1&x0=5&y0=1&x1=3&y1=2", 400, "x1")]
    [InlineData("chips/cutout.fits?hdu=1&x0=1&y0=1&x1=2", 400, "y1")]
    [InlineData("chips/cutout.fits?hdu=1&x0=1&y0=1&x1=2&y1=2&ra=33.3&dec=-12.7", 400, "ra")]
    [InlineData("chips/cutout.fits?hdu=1&x0=1&y0=1&x1=2&y1=2&size=3", 400, "size")]
    [InlineData("chips/cutout.fits?ra=33.3&dec=-12.7", 400, "size")]
    [InlineData("chips/cutout.fits?ra=33.3&dec=-12.7&size=-3", 400, "size")]
    [InlineData("chips/cutout.fits?ra=33.3&dec=-12.7&size=1,2,3", 400, "size")]
    [InlineData("chips/cutout.fits?ra=33.3&dec=-12.7&size=NaN", 400, "size")]
    [InlineData("chips/cutout.fits?ra=400&dec=0&size=5", 400, "ra")]
    [InlineData("chips/cutout.fits?ra=33.3&size=5", 400, "dec")]
    [InlineData("chips/cutout.fits", 400, "x0")]
    [InlineData("chips/cutout.fits?hdu=9&x0=1&y0=1&x1=2&y1=2", 404, "hdu")]
    [InlineData("chips/cutout.fits?ra=200&dec=40&size=5", 404, "ra")]
    [InlineData("nofield/cutout.fits?hdu=1&x0=1&y0=1&x1=2&y1=2", 404, "field")]
    public async Task BadRequestsNameTheParameter(string query, int status, string parameter)
    {
        var response = await fixture.Client.GetAsync($"/api/fields/{query}");
        Assert.Equal(status, (int)response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal(parameter, problem.GetProperty("parameter").GetString());
    }

    private static int[] Box(HttpResponseMessage response) =>
        [.. response.Headers.GetValues("X-Cutout-Box").Single().Split(',').Select(v => int.Parse(v, CultureInfo.InvariantCulture))];

    private (double Ra, double Dec) SkyOf(int hdu, double x, double y)
    {
        var text = DebianPython.RunCode("""
            import sys, warnings
            from astropy.io import fits
            from astropy.wcs import WCS
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                w = WCS(fits.open(sys.argv[1])[int(sys.argv[2])].header)
            r, d = w.all_pix2world(float(sys.argv[3]), float(sys.argv[4]), 1)
            print(repr(float(r)), repr(float(d)))
            """, [fixture.ChipsPath, hdu.ToString(CultureInfo.InvariantCulture), Text(x), Text(y)]);
        var parts = text.Trim().Split(' ');
        return (double.Parse(parts[0], CultureInfo.InvariantCulture), double.Parse(parts[1], CultureInfo.InvariantCulture));
    }
}
