using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Mosaic.Testing;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests;

public sealed class RenderEndpointTests(DisplayReference reference) : IClassFixture<DisplayReference>
{
    // lo = 60, hi = 187.5 makes the contract's gray formula DN = round(255 (v - lo)/(hi - lo)) = 2 (v - 60) exact for
    // the half-integer values of single.fits, so the expected levels carry no rounding question.
    private const string Box = "x0=15&y0=5&x1=30&y1=14";
    private const string Linear = "stretch=linear&lo=60&hi=187.5";

    private static int ExpectedLevel(double v) => (int)Math.Clamp(Math.Round(255 * (v - 60) / 127.5, MidpointRounding.AwayFromZero), 0, 255);

    private async Task<(Image<Rgba32> Image, PngColorType? ColorType, HttpResponseMessage Response)> RenderAsync(string query)
    {
        var response = await reference.Client.GetAsync($"/api/fields/single/render.png?{query}");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("image/png", response.Content.Headers.ContentType?.MediaType);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        // ImageSharp 2.1.13 decodes the PNG and reports its colour type: an outside decoder for every check here.
        var info = Image.Identify(bytes);
        return (Image.Load<Rgba32>(bytes), info.Metadata.GetPngMetadata().ColorType, response);
    }

    [Fact]
    public async Task A_transparent_mask_gives_gray_with_alpha_and_levels_from_astropys_values_with_row_y1_on_top()
    {
        var (image, colorType, response) = await RenderAsync($"{Box}&{Linear}&masked=transparent");
        using var _ = image;
        Assert.Equal(PngColorType.GrayscaleWithAlpha, colorType);
        Assert.Equal(16, image.Width);
        Assert.Equal(10, image.Height);
        Assert.Equal("inline; filename=\"single-single-0-15-5-30-14.png\"", response.Content.Headers.ContentDisposition?.ToString());
        // astropy.io.fits read of the same box, listed from FITS y = 14 (top row of the PNG) down to y = 5.
        var rows = reference.Expected.GetProperty("singleRender").EnumerateArray().ToArray();
        for (var r = 0; r < rows.Length; r++)
        {
            var row = rows[r].EnumerateArray().ToArray();
            for (var c = 0; c < row.Length; c++)
            {
                var pixel = image[c, r];
                if (row[c].ValueKind == JsonValueKind.Null)
                {
                    Assert.Equal(0, pixel.A);
                    continue;
                }
                Assert.Equal(255, pixel.A);
                Assert.Equal(ExpectedLevel(row[c].GetDouble()), pixel.R);
            }
        }
        // The BLANK pixel at FITS (21, 11) is 3 rows below y1 = 14 and 6 columns right of x0 = 15.
        Assert.Equal(0, image[6, 3].A);
    }

    [Fact]
    public async Task Without_masked_the_gray_palette_paints_masked_pixels_in_its_own_colour_as_RGB()
    {
        var (image, colorType, _) = await RenderAsync($"{Box}&{Linear}");
        using var __ = image;
        Assert.Equal(PngColorType.Rgb, colorType);
        var palettes = await reference.Client.GetFromJsonAsync<JsonElement>("/api/palettes");
        var maskedHex = palettes.EnumerateArray().First(p => p.GetProperty("name").GetString() == "gray").GetProperty("defaultMasked").GetString()!;
        var masked = image[6, 3];
        Assert.Equal(maskedHex, $"{masked.R:x2}{masked.G:x2}{masked.B:x2}");
        Assert.False(masked.R == masked.G && masked.G == masked.B, "the masked colour is no gray a value could have");
        var first = reference.Expected.GetProperty("singleRender")[0][0].GetDouble();
        Assert.Equal(new Rgba32((byte)ExpectedLevel(first), (byte)ExpectedLevel(first), (byte)ExpectedLevel(first), 255), image[0, 0]);
    }

    [Fact]
    public async Task A_named_masked_colour_is_used_and_a_box_without_masked_pixels_stays_8_bit_gray()
    {
        var (image, colorType, _) = await RenderAsync($"{Box}&{Linear}&masked=00A0ff");
        using (image)
        {
            Assert.Equal(PngColorType.Rgb, colorType);
            Assert.Equal(new Rgba32(0, 0xa0, 0xff, 255), image[6, 3]);
        }
        var (clean, cleanType, _) = await RenderAsync($"x0=1&y0=1&x1=10&y1=3&{Linear}&masked=transparent");
        using (clean)
        {
            Assert.Equal(PngColorType.Grayscale, cleanType);
            Assert.Equal(10, clean.Width);
            Assert.Equal(3, clean.Height);
            // The bottom row of the PNG is FITS y = 1; astropy read (1, 1) for the probe test.
            var v = reference.Data.Reference.RootElement.GetProperty("single").GetProperty("1,1").GetDouble();
            Assert.Equal(ExpectedLevel(v), clean[0, 2].R);
        }
    }

    [Theory]
    [InlineData("x0=1&y0=1&x1=10", "y1")]
    [InlineData("y0=1&x1=10&y1=10", "x0")]
    [InlineData("x0=0&y0=1&x1=10&y1=10", "x0")]
    [InlineData("x0=1&y0=1&x1=601&y1=10", "x1")]
    [InlineData("x0=1&y0=1&x1=10&y1=301", "y1")]
    [InlineData("x0=20&y0=1&x1=10&y1=10", "x1")]
    [InlineData("x0=1&y0=10&x1=10&y1=5", "y1")]
    [InlineData("x0=1.5&y0=1&x1=10&y1=10", "x0")]
    [InlineData("x0=1&y0=1&x1=10&y1=10&stretch=spiral", "stretch")]
    [InlineData("x0=1&y0=1&x1=10&y1=10&masked=nope", "masked")]
    public async Task Bad_boxes_and_settings_get_400_naming_the_parameter(string query, string parameter)
    {
        var response = await reference.Client.GetAsync($"/api/fields/single/render.png?{query}");
        await AssertBadParameter(response, parameter);
    }

    [Fact]
    public async Task Without_hdu_a_field_whose_bands_have_several_HDUs_is_refused()
    {
        var response = await reference.Client.GetAsync("/api/fields/trio/render.png?x0=1&y0=1&x1=10&y1=10");
        await AssertBadParameter(response, "hdu");
        var named = await reference.Client.GetAsync("/api/fields/trio/render.png?band=green&hdu=CCD2&x0=1&y0=1&x1=10&y1=10");
        Assert.Equal(HttpStatusCode.OK, named.StatusCode);
    }

    [Fact]
    public async Task More_than_50_megapixels_is_refused_naming_the_box()
    {
        // An 8000 x 7000 BITPIX 8 image (56 Mpx): the header from astropy.io.fits, the data a sparse run of zeros.
        var folder = Path.Combine(reference.Data.Root, $"large-{Guid.NewGuid():N}");
        Directory.CreateDirectory(folder);
        DebianPython.RunCode("""
import sys, os
from astropy.io import fits
h = fits.Header()
h["SIMPLE"] = True; h["BITPIX"] = 8; h["NAXIS"] = 2; h["NAXIS1"] = 8000; h["NAXIS2"] = 7000
path = os.path.join(sys.argv[1], "large.fits")
h.tofile(path)
data = 8000 * 7000
with open(path, "r+b") as f:
    f.truncate(os.path.getsize(path) + (data + 2879) // 2880 * 2880)
with fits.open(path) as check:
    assert check[0].data.shape == (7000, 8000)
""", [folder]);
        using var factory = new MosaicFactory(folder, reference.Data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var response = await client.GetAsync("/api/fields/large/render.png?x0=1&y0=1&x1=8000&y1=7000");
        var problem = await AssertBadParameter(response, "x0,y0,x1,y1");
        Assert.Contains("56000000", problem.GetProperty("detail").GetString());
    }

    internal static async Task<JsonElement> AssertBadParameter(HttpResponseMessage response, string parameter)
    {
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal(400, problem.GetProperty("status").GetInt32());
        Assert.Equal(parameter, problem.GetProperty("parameter").GetString());
        Assert.False(string.IsNullOrWhiteSpace(problem.GetProperty("detail").GetString()));
        return problem;
    }
}
