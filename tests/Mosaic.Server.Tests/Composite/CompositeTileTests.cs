using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests.Composite;

/// <summary>
/// Colour composites through the tile, render and display endpoints, against astropy.visualization (Debian
/// python3-astropy) on the same FITS values; PNGs decoded by ImageSharp 2.1.13.
/// </summary>
public sealed class CompositeTileTests(CompositeData data) : IClassFixture<CompositeData>
{
    private const int W = CompositeData.Width, H = CompositeData.Height, T = 256;
    private const string Bands = "red=long&green=mid&blue=short";

    private async Task<(Image<Rgba32> Image, PngColorType? ColorType, HttpResponseMessage Response)> GetPngAsync(string url)
    {
        var response = await data.Client.GetAsync(url);
        Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        Assert.Equal("image/png", response.Content.Headers.ContentType?.MediaType);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        return (Image.Load<Rgba32>(bytes), Image.Identify(bytes).Metadata.GetPngMetadata().ColorType, response);
    }

    /// <summary>Every pixel of native tile (1, tx, ty) against the reference image (3 bytes a pixel, top row first).</summary>
    private async Task<int> CompareNativeTileAsync(string query, int tx, int ty, byte[] reference)
    {
        var (image, _, _) = await GetPngAsync($"/tiles/colour/1/{tx}/{ty}.png?{query}");
        using var _ = image;
        var worst = 0;
        for (var row = 0; row < T; row++)
            for (var column = 0; column < T; column++)
            {
                int r = ty * T + row, c = tx * T + column;
                var p = image[column, row];
                if (r >= H || c >= W || data.Masked(r, c))
                {
                    // Outside the image or masked in any band: transparent.
                    Assert.Equal(0, p.A);
                    continue;
                }
                Assert.Equal(255, p.A);
                var at = 3 * (r * W + c);
                worst = Math.Max(worst, Math.Max(Math.Abs(p.R - reference[at]), Math.Max(Math.Abs(p.G - reference[at + 1]), Math.Abs(p.B - reference[at + 2]))));
            }
        return worst;
    }

    [Fact]
    public async Task Lupton_tiles_at_native_resolution_match_make_lupton_rgb_within_1_DN()
    {
        const string query = $"rgb=lupton&{Bands}&q=6&range=80&min=38,52,66&scale=1,1.2,0.9";
        var reference = data.Lupton(6, 80, [38, 52, 66], [1, 1.2, 0.9]);
        for (var ty = 0; ty < 2; ty++)
            for (var tx = 0; tx < 2; tx++)
                Assert.InRange(await CompareNativeTileAsync(query, tx, ty, reference), 0, 1);
        // A tile with masked pixels is RGBA (PNG colour type 6); one without, RGB.
        Assert.Equal(PngColorType.RgbWithAlpha, (await GetPngAsync($"/tiles/colour/1/0/0.png?{query}")).ColorType);
    }

    [Fact]
    public async Task The_default_lupton_composite_uses_each_median_and_ten_mean_MAD_sigmas_and_matches_astropy()
    {
        var resolved = await data.Client.GetFromJsonAsync<JsonElement>($"/api/fields/colour/display?rgb=lupton&{Bands}");
        Assert.Equal("lupton", resolved.GetProperty("mode").GetString());
        var lupton = resolved.GetProperty("lupton");
        var min = lupton.GetProperty("min").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var range = lupton.GetProperty("range").GetDouble();
        var sigmas = data.Statistics.GetProperty("madSigma").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        // numpy.nanmedian and astropy.stats.mad_std; the server's histogram figures are exact to a bin (2^-11 relative) or so.
        for (var c = 0; c < 3; c++) Assert.Equal(data.Statistics.GetProperty("median")[c].GetDouble(), min[c], 0.05);
        Assert.Equal(10 * sigmas.Average(), range, 0.02 * range);
        Assert.Equal(8, lupton.GetProperty("q").GetDouble());
        // astropy's AsinhMapping slope: 0.1 × 255 / asinh(0.1 Q).
        Assert.Equal(25.5 / Math.Asinh(0.8), lupton.GetProperty("slope").GetDouble(), 1e-9);

        var reference = data.Lupton(8, range, min, [1, 1, 1]);
        Assert.InRange(await CompareNativeTileAsync($"rgb=lupton&{Bands}", 0, 0, reference), 0, 1);
    }

    [Fact]
    public async Task A_saturated_source_keeps_the_ratio_of_its_bands()
    {
        var (image, _, _) = await GetPngAsync($"/tiles/colour/1/0/0.png?rgb=lupton&{Bands}&min=40,55,70&range=50");
        using var _ = image;
        // FITS rows 151..158 (numpy 150..157) are rows-from-top 122..129; columns 201..208. Values sky + 5e5 × (1, 0.45, 0.15):
        // Lupton et al. (2004) divide all channels by the largest where it passes 1, so the pixel shows 255 × (1, 0.45, 0.15), truncated.
        for (var row = 123; row <= 128; row++)
            for (var column = 201; column <= 206; column++)
            {
                var p = image[column, row];
                var x = Enumerable.Range(0, 3).Select(c => data.Values[c][row * W + column] - new[] { 40.0, 55, 70 }[c]).ToArray();
                var largest = x.Max();
                Assert.InRange(p.R, 255 * x[0] / largest - 1, 255 * x[0] / largest + 0.01);
                Assert.InRange(p.G, 255 * x[1] / largest - 1, 255 * x[1] / largest + 0.01);
                Assert.InRange(p.B, 255 * x[2] / largest - 1, 255 * x[2] / largest + 0.01);
                Assert.InRange(p.G, 113, 115);
            }
    }

    [Fact]
    public async Task Per_band_tiles_follow_each_channels_own_display_within_1_DN()
    {
        const string query = $"rgb=each&{Bands}&stretch=linear&lo=30&hi=400&green-lo=45&green-hi=900&blue-stretch=log&blue-a=200&blue-lo=60&blue-hi=1200&scale=1,1.4,0.8";
        var reference = data.PerBand(new object[]
        {
            new { lo = 30.0, hi = 400.0, stretch = "linear", a = 0.0, scale = 1.0 },
            new { lo = 45.0, hi = 900.0, stretch = "linear", a = 0.0, scale = 1.4 },
            new { lo = 60.0, hi = 1200.0, stretch = "log", a = 200.0, scale = 0.8 },
        });
        for (var ty = 0; ty < 2; ty++)
            for (var tx = 0; tx < 2; tx++)
                Assert.InRange(await CompareNativeTileAsync(query, tx, ty, reference), 0, 1);

        var resolved = await data.Client.GetFromJsonAsync<JsonElement>($"/api/fields/colour/display?{query}");
        var channels = resolved.GetProperty("channels");
        Assert.Equal(45, channels.GetProperty("green").GetProperty("lo").GetDouble());
        Assert.Equal(1200, channels.GetProperty("blue").GetProperty("hi").GetDouble());
        Assert.Equal("log", channels.GetProperty("blue").GetProperty("stretch").GetProperty("name").GetString());
        Assert.Equal("linear", channels.GetProperty("red").GetProperty("stretch").GetProperty("name").GetString());
        Assert.Equal([1, 1.4, 0.8], resolved.GetProperty("scale").EnumerateArray().Select(e => e.GetDouble()).ToArray());
    }

    [Fact]
    public async Task Render_png_of_a_box_matches_make_lupton_rgb_with_row_y1_on_top()
    {
        var reference = data.Lupton(8, 60, [40, 55, 70], [1, 1, 1]);
        var (image, colorType, _) = await GetPngAsync($"/api/fields/colour/render.png?rgb=lupton&{Bands}&min=40,55,70&range=60&x0=190&y0=5&x1=260&y1=275");
        using var _ = image;
        Assert.Equal((71, 271), (image.Width, image.Height));
        Assert.Equal(PngColorType.RgbWithAlpha, colorType);
        for (var row = 0; row < image.Height; row++)
            for (var column = 0; column < image.Width; column++)
            {
                // PNG row 0 is FITS y = 275, i.e. rows-from-top 280 - 275 = 5.
                int r = H - 275 + row, c = 189 + column;
                var p = image[column, row];
                if (data.Masked(r, c)) { Assert.Equal(0, p.A); continue; }
                var at = 3 * (r * W + c);
                Assert.InRange(p.R, reference[at] - 1, reference[at] + 1);
                Assert.InRange(p.G, reference[at + 1] - 1, reference[at + 1] + 1);
                Assert.InRange(p.B, reference[at + 2] - 1, reference[at + 2] + 1);
            }
    }

    [Fact]
    public async Task An_opaque_masked_colour_fills_pixels_masked_in_any_band()
    {
        var (image, colorType, _) = await GetPngAsync($"/tiles/colour/1/0/0.png?rgb=lupton&{Bands}&masked=00ff80");
        using var _ = image;
        Assert.Equal(PngColorType.Rgb, colorType);
        // The middle band's hole: numpy rows 10..19 are rows-from-top 260..269 (tile y 1); the first band's pixel (270, 5) is row 9, column 5.
        Assert.Equal(new Rgba32(0, 255, 128, 255), image[5, 9]);
        Assert.NotEqual(new Rgba32(0, 255, 128, 255), image[6, 9]);
        using var lower = (await GetPngAsync($"/tiles/colour/1/0/1.png?rgb=lupton&{Bands}&masked=00ff80")).Image;
        Assert.Equal(new Rgba32(0, 255, 128, 255), lower[255, 260 - 256]);
    }

    [Fact]
    public async Task Equal_composites_share_an_etag_and_different_ones_do_not()
    {
        async Task<string> ETag(string query)
        {
            var response = await data.Client.GetAsync($"/tiles/colour/1/0/0.png?{query}");
            Assert.Equal(HttpStatusCode.OK, response.StatusCode);
            return response.Headers.ETag!.Tag;
        }
        var plain = await ETag($"rgb=lupton&{Bands}");
        Assert.Equal(plain, await ETag("rgb=LUPTON&red=LONG&green=Mid&blue=short&q=8&scale=1,1,1&masked=transparent"));
        Assert.NotEqual(plain, await ETag($"rgb=lupton&{Bands}&q=9"));
        Assert.NotEqual(plain, await ETag("rgb=lupton&red=short&green=mid&blue=long"));
        Assert.NotEqual(plain, await ETag($"rgb=each&{Bands}"));
        Assert.NotEqual(plain, await ETag("band=long"));
        // Parameters of the other mode are checked but do not count.
        Assert.Equal(plain, await ETag($"rgb=lupton&{Bands}&stretch=log&blue-lo=3&blue-hi=90"));
        var each = await ETag($"rgb=each&{Bands}");
        Assert.Equal(each, await ETag($"rgb=each&{Bands}&q=3&range=9"));
        Assert.NotEqual(each, await ETag($"rgb=each&{Bands}&blue-stretch=sqrt"));

        // A URL naming all three bands' versions is immutable.
        var field = await data.Client.GetFromJsonAsync<JsonElement>("/api/fields/colour");
        var versions = field.GetProperty("bands").EnumerateArray().ToDictionary(b => b.GetProperty("name").GetString()!, b => b.GetProperty("version").GetString()!);
        var v = $"{versions["long"]}.{versions["mid"]}.{versions["short"]}";
        var immutable = await data.Client.GetAsync($"/tiles/colour/1/0/0.png?rgb=lupton&{Bands}&v={v}");
        Assert.Contains("immutable", immutable.Headers.CacheControl!.ToString());
        var stale = await data.Client.GetAsync($"/tiles/colour/1/0/0.png?rgb=lupton&{Bands}&v={versions["long"]}");
        Assert.Equal("no-cache", stale.Headers.CacheControl!.ToString());
    }

    [Theory]
    [InlineData("rgb=rainbow&" + Bands, "rgb")]
    [InlineData("rgb=lupton&red=long&green=mid", "blue")]
    [InlineData("rgb=lupton&red=nope&green=mid&blue=short", "red")]
    [InlineData("rgb=each&red=long&green=unknown&blue=short", "green")]
    [InlineData("rgb=lupton&" + Bands + "&q=0", "q")]
    [InlineData("rgb=lupton&" + Bands + "&q=nan", "q")]
    [InlineData("rgb=lupton&" + Bands + "&range=-2", "range")]
    [InlineData("rgb=lupton&" + Bands + "&range=abc", "range")]
    [InlineData("rgb=lupton&" + Bands + "&min=1,2", "min")]
    [InlineData("rgb=lupton&" + Bands + "&min=1,inf,2", "min")]
    [InlineData("rgb=lupton&" + Bands + "&scale=1,1", "scale")]
    [InlineData("rgb=each&" + Bands + "&scale=1,-1,1", "scale")]
    [InlineData("rgb=each&" + Bands + "&palette=cubehelix", "palette")]
    [InlineData("rgb=each&" + Bands + "&blue-lo=abc", "blue-lo")]
    [InlineData("rgb=each&" + Bands + "&red-stretch=wavy", "red-stretch")]
    [InlineData("rgb=each&" + Bands + "&green-lo=5&green-hi=1", "green-hi")]
    [InlineData("rgb=each&" + Bands + "&red-palette=gray", "red-palette")]
    [InlineData("rgb=each&" + Bands + "&blue-colour=1", "blue-colour")]
    [InlineData("rgb=lupton&" + Bands + "&masked=purple", "masked")]
    [InlineData("rgb=each&" + Bands + "&stretch=power&gamma=-1", "gamma")]
    public async Task Every_bad_composite_parameter_gets_400_naming_it(string query, string parameter)
    {
        await RenderEndpointTests.AssertBadParameter(await data.Client.GetAsync($"/tiles/colour/1/0/0.png?{query}"), parameter);
        await RenderEndpointTests.AssertBadParameter(await data.Client.GetAsync($"/api/fields/colour/render.png?x0=1&y0=1&x1=5&y1=5&{query}"), parameter);
        await RenderEndpointTests.AssertBadParameter(await data.Client.GetAsync($"/api/fields/colour/display?{query}"), parameter);
    }

    [Fact]
    public async Task An_unknown_band_is_named_with_the_bands_the_field_has()
    {
        var response = await data.Client.GetAsync("/tiles/colour/1/0/0.png?rgb=lupton&red=long&green=mid&blue=infrared");
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        var detail = problem.GetProperty("detail").GetString()!;
        Assert.Contains("infrared", detail);
        foreach (var band in CompositeData.Bands) Assert.Contains(band, detail);
    }

    [Theory]
    [InlineData("red=base&green=shifted&blue=base", "green")]
    [InlineData("red=base&green=base&blue=short", "blue")]
    public async Task Bands_on_different_grids_get_422_naming_the_alignment(string bands, string channel)
    {
        foreach (var url in new[] { $"/tiles/offgrid/1/0/0.png?rgb=lupton&{bands}", $"/api/fields/offgrid/display?rgb=each&{bands}",
                     $"/api/fields/offgrid/render.png?rgb=lupton&{bands}&x0=1&y0=1&x1=5&y1=5" })
        {
            var response = await data.Client.GetAsync(url);
            Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
            var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
            Assert.Contains("different pixel grids", problem.GetProperty("detail").GetString());
            Assert.Contains("camera-canvas alignment", problem.GetProperty("detail").GetString());
            Assert.Equal(channel, problem.GetProperty("parameter").GetString());
        }
        // One band three times is one grid.
        var same = await data.Client.GetAsync("/tiles/offgrid/1/0/0.png?rgb=lupton&red=base&green=base&blue=base");
        Assert.Equal(HttpStatusCode.OK, same.StatusCode);
    }

    [Fact]
    public async Task The_OpenAPI_document_lists_the_composite_parameters_with_descriptions()
    {
        var doc = await data.Client.GetFromJsonAsync<JsonElement>("/openapi/v1.json");
        foreach (var path in new[] { "/tiles/{field}/{z}/{x}/{y}.png", "/api/fields/{field}/render.png", "/api/fields/{field}/display" })
        {
            var parameters = doc.GetProperty("paths").GetProperty(path).GetProperty("get").GetProperty("parameters").EnumerateArray()
                .Where(p => p.GetProperty("in").GetString() == "query")
                .ToDictionary(p => p.GetProperty("name").GetString()!);
            foreach (var name in new[] { "rgb", "red", "green", "blue", "q", "range", "min", "scale", "hdu" })
            {
                Assert.True(parameters.ContainsKey(name), $"{path} does not document '{name}'");
                Assert.False(string.IsNullOrWhiteSpace(parameters[name].GetProperty("description").GetString()), $"{path}: '{name}' has no description");
            }
        }
    }
}
