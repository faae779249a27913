using System.Globalization;
using System.Net;
using System.Text.Json;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests;

/// <summary>
/// The whole-field canvas through the HTTP API, against astropy.wcs (wcslib; Debian python3-astropy) given the
/// server's canvas header — canvas pixel → sky (all_pix2world, origin 1) → chip pixel (all_world2pix, origin 1,
/// iterative SIP inverse) — astropy.io.fits for the pixel values, numpy for the documented resampling, and
/// ImageSharp 2.1 as the outside PNG decoder.
/// </summary>
public sealed class CanvasEndpointTests(CanvasDataFixture data) : IClassFixture<CanvasDataFixture>
{
    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private JsonElement Band(string name) => data.Camera.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == name);

    private async Task<Image<Rgba32>> GetPngAsync(string url)
    {
        var response = await data.Client.GetAsync(url);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {(int)response.StatusCode} {System.Text.Encoding.UTF8.GetString(bytes)}");
        Assert.Equal("image/png", response.Content.Headers.ContentType?.MediaType);
        return Image.Load<Rgba32>(bytes);
    }

    [Fact]
    public void Both_bands_get_a_canvas_of_one_size_listing_the_chips_placed_and_the_chip_left_off()
    {
        JsonElement r = Band("r").GetProperty("canvas"), g = Band("g").GetProperty("canvas");
        // One plan for the field: the canvas header's NAXIS1/2 (read back by astropy) is every band's size.
        var expected = data.Ref.GetProperty("canvas");
        foreach (var canvas in new[] { r, g })
        {
            Assert.Equal(expected.GetProperty("width").GetInt32(), canvas.GetProperty("width").GetInt32());
            Assert.Equal(expected.GetProperty("height").GetInt32(), canvas.GetProperty("height").GetInt32());
            Assert.Equal("TAN", canvas.GetProperty("sky").GetProperty("projection").GetString());
        }
        Assert.Equal([1, 2, 3], r.GetProperty("chips").EnumerateArray().Select(c => c.GetProperty("hdu").GetInt32()));
        Assert.Equal(["GCHIP1", "GCHIP2"], g.GetProperty("chips").EnumerateArray().Select(c => c.GetProperty("name").GetString()));

        // CHIP04 has no CTYPE keywords: left off, with the reason, and still served on its own.
        var excluded = Assert.Single(r.GetProperty("excluded").EnumerateArray());
        Assert.Equal(4, excluded.GetProperty("hdu").GetInt32());
        Assert.Equal("CHIP04", excluded.GetProperty("name").GetString());
        Assert.Contains("WCS", excluded.GetProperty("reason").GetString());
        Assert.Empty(g.GetProperty("excluded").EnumerateArray());
        Assert.Contains(Band("r").GetProperty("hdus").EnumerateArray(), h => h.GetProperty("name").GetString() == "CHIP04");
    }

    [Theory]
    [InlineData("r")]
    [InlineData("g")]
    public void Each_outline_starts_at_the_chip_corner_where_astropy_puts_it_on_the_canvas(string band)
    {
        foreach (var chip in Band(band).GetProperty("canvas").GetProperty("chips").EnumerateArray())
        {
            var outline = chip.GetProperty("outline").EnumerateArray().Select(p => (X: p[0].GetDouble(), Y: p[1].GetDouble())).ToList();
            // Reference: astropy all_pix2world of chip pixel (0.5, 0.5), then all_world2pix with the canvas header.
            var corner = data.Ref.GetProperty(band).GetProperty("corners").GetProperty(chip.GetProperty("name").GetString()!);
            Assert.Equal(corner[0].GetDouble(), outline[0].X, 1e-5);
            Assert.Equal(corner[1].GetDouble(), outline[0].Y, 1e-5);
            Assert.Equal(outline[0], outline[^1]);
            Assert.True(outline.Count >= 9, "every edge is sampled, so SIP curvature shows");
        }
    }

    [Theory]
    [InlineData("r")]
    [InlineData("g")]
    public async Task A_canvas_probe_by_pixel_names_the_chip_and_chip_pixel_astropy_gives_and_the_original_value(string band)
    {
        foreach (var p in data.Ref.GetProperty(band).GetProperty("points").EnumerateArray())
        {
            double cx = p.GetProperty("canvasX").GetDouble(), cy = p.GetProperty("canvasY").GetDouble();
            var probe = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?band={band}&hdu=canvas&x={Num(cx)}&y={Num(cy)}");
            var what = $"{band} canvas ({cx}, {cy})";
            Assert.Equal(p.GetProperty("hdu").GetInt32(), probe.GetProperty("hdu").GetInt32());
            Assert.Equal(p.GetProperty("name").GetString(), probe.GetProperty("hduName").GetString());
            // Reference: astropy canvas all_pix2world → chip all_world2pix (tolerance 1e-12).
            Assert.True(Math.Abs(p.GetProperty("x").GetDouble() - probe.GetProperty("atX").GetDouble()) < 1e-6, $"{what}: atX {probe.GetProperty("atX")} vs {p.GetProperty("x")}");
            Assert.True(Math.Abs(p.GetProperty("y").GetDouble() - probe.GetProperty("atY").GetDouble()) < 1e-6, $"{what}: atY {probe.GetProperty("atY")} vs {p.GetProperty("y")}");
            Assert.Equal(p.GetProperty("px").GetInt32(), probe.GetProperty("x").GetInt32());
            Assert.Equal(p.GetProperty("py").GetInt32(), probe.GetProperty("y").GetInt32());
            // The original float32 pixel astropy.io.fits reads, not a resampled one.
            Assert.Equal(p.GetProperty("value").GetDouble(), probe.GetProperty("value").GetDouble());
            Assert.Equal("adu", probe.GetProperty("bunit").GetString());
            Assert.Equal(cx, probe.GetProperty("canvas").GetProperty("x").GetDouble());
            Assert.Equal(cy, probe.GetProperty("canvas").GetProperty("y").GetDouble());
            SkyAssert.SamePosition(p.GetProperty("ra").GetDouble(), p.GetProperty("dec").GetDouble(),
                probe.GetProperty("ra").GetDouble(), probe.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, what);
        }
    }

    [Fact]
    public async Task A_canvas_probe_by_RA_Dec_lands_on_astropys_canvas_pixel_and_chip()
    {
        foreach (var p in data.Ref.GetProperty("r").GetProperty("points").EnumerateArray())
        {
            double ra = p.GetProperty("ra").GetDouble(), dec = p.GetProperty("dec").GetDouble();
            var probe = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?band=r&hdu=CANVAS&ra={Num(ra)}&dec={Num(dec)}");
            // Reference: astropy all_world2pix with the canvas header (a plain TAN: exact), and the chain on to the chip.
            Assert.Equal(p.GetProperty("canvasX").GetDouble(), probe.GetProperty("canvas").GetProperty("x").GetDouble(), 1e-6);
            Assert.Equal(p.GetProperty("canvasY").GetDouble(), probe.GetProperty("canvas").GetProperty("y").GetDouble(), 1e-6);
            Assert.Equal(p.GetProperty("hdu").GetInt32(), probe.GetProperty("hdu").GetInt32());
            Assert.Equal(p.GetProperty("px").GetInt32(), probe.GetProperty("x").GetInt32());
            Assert.Equal(p.GetProperty("py").GetInt32(), probe.GetProperty("y").GetInt32());
            Assert.Equal(p.GetProperty("value").GetDouble(), probe.GetProperty("value").GetDouble());
        }
    }

    [Fact]
    public async Task A_canvas_probe_in_a_chip_gap_answers_with_no_chip_and_no_value_but_the_sky_position()
    {
        var gap = data.Ref.GetProperty("gap");
        double cx = gap.GetProperty("canvasX").GetDouble(), cy = gap.GetProperty("canvasY").GetDouble();
        var byPixel = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?band=r&hdu=canvas&x={Num(cx)}&y={Num(cy)}");
        // Reference: astropy finds the point on none of the chips (all_world2pix of each lands outside it).
        foreach (var name in new[] { "hdu", "hduName", "x", "y", "value" })
            Assert.Equal(JsonValueKind.Null, byPixel.GetProperty(name).ValueKind);
        SkyAssert.SamePosition(gap.GetProperty("ra").GetDouble(), gap.GetProperty("dec").GetDouble(),
            byPixel.GetProperty("ra").GetDouble(), byPixel.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, "gap");

        var bySky = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?band=r&hdu=canvas&ra={Num(gap.GetProperty("ra").GetDouble())}&dec={Num(gap.GetProperty("dec").GetDouble())}");
        Assert.Equal(JsonValueKind.Null, bySky.GetProperty("hdu").ValueKind);
        Assert.Equal(cx, bySky.GetProperty("canvas").GetProperty("x").GetDouble(), 1e-6);
        Assert.Equal(cy, bySky.GetProperty("canvas").GetProperty("y").GetDouble(), 1e-6);

        // Without hdu=canvas the probe keeps its old answer: a sky position in a gap is a 404 saying so.
        await SkyAssert.Problem(data.Client, $"/api/fields/camera/probe?band=r&ra={Num(gap.GetProperty("ra").GetDouble())}&dec={Num(gap.GetProperty("dec").GetDouble())}", HttpStatusCode.NotFound, "ra");
        // Off the canvas by pixel: a 400 naming the coordinate.
        await SkyAssert.Problem(data.Client, "/api/fields/camera/probe?band=r&hdu=canvas&x=0.2&y=10", HttpStatusCode.BadRequest, "x");
    }

    [Theory]
    [InlineData("r")]
    [InlineData("g")]
    public async Task Native_canvas_tiles_show_the_documented_resampling_of_the_chip_values_and_gaps_are_transparent(string band)
    {
        var canvas = Band(band).GetProperty("canvas");
        int height = canvas.GetProperty("height").GetInt32(), zoom = canvas.GetProperty("maxZoom").GetInt32();
        foreach (var p in data.Ref.GetProperty(band).GetProperty("pixels").EnumerateArray())
        {
            int x = p.GetProperty("canvasX").GetInt32(), y = p.GetProperty("canvasY").GetInt32();
            var v = p.GetProperty("value").GetDouble();
            // Tiles count rows down from the top (highest FITS y) at one canvas pixel per tile pixel.
            int fromTop = height - y, column = x - 1;
            // Linear limits v ± 2.55 make one grey level 0.02 value units: DN = round(255 (u - lo) / (hi - lo)) is
            // 127 or 128 for u = v; ±2 levels allow the coarse-grid mapping error (goal < 0.01 chip px, the values
            // changing by at most ~1.2 per px) and float32 rounding.
            using var tile = await GetPngAsync($"/tiles/camera/{zoom}/{column / 256}/{fromTop / 256}.png?band={band}&hdu=canvas&stretch=linear&palette=gray&lo={Num(v - 2.55)}&hi={Num(v + 2.55)}");
            var pixel = tile[column % 256, fromTop % 256];
            Assert.Equal(255, pixel.A);
            Assert.True(Math.Abs(pixel.R - 127.5) <= 2.5, $"{band} canvas ({x}, {y}): grey {pixel.R} where numpy's bilinear value {v} gives 127.5");
        }

        if (band != "r") return;
        var gap = data.Ref.GetProperty("gap");
        int gx = gap.GetProperty("pixelX").GetInt32() - 1, gy = height - gap.GetProperty("pixelY").GetInt32();
        using var gapTile = await GetPngAsync($"/tiles/camera/{zoom}/{gx / 256}/{gy / 256}.png?band=r&hdu=canvas");
        Assert.Equal(0, gapTile[gx % 256, gy % 256].A);
    }

    [Fact]
    public async Task A_star_at_one_sky_position_lands_on_the_same_canvas_pixel_in_bands_of_different_grids()
    {
        var star = data.Ref.GetProperty("star");
        double sx = star.GetProperty("canvasX").GetDouble(), sy = star.GetProperty("canvasY").GetDouble();
        int x0 = (int)Math.Round(sx) - 10, y0 = (int)Math.Round(sy) - 10, x1 = x0 + 20, y1 = y0 + 20;
        var centroids = new List<(double X, double Y)>();
        foreach (var band in new[] { "r", "g" })
        {
            // The star's core above its band's background (astropy's position, the writer's background formula).
            var bg = star.GetProperty(band).GetDouble();
            using var image = await GetPngAsync($"/api/fields/camera/render.png?band={band}&hdu=canvas&x0={x0}&y0={y0}&x1={x1}&y1={y1}&stretch=linear&palette=gray&lo={Num(bg + 200)}&hi={Num(bg + 4200)}");
            double sum = 0, mx = 0, my = 0;
            for (var row = 0; row < image.Height; row++)
                for (var col = 0; col < image.Width; col++)
                {
                    double w = image[col, row].R;
                    sum += w;
                    mx += w * (x0 + col);
                    my += w * (y1 - row); // the PNG's top row is y1
                }
            Assert.True(sum > 255 * 5, $"band {band}: the star shows");
            centroids.Add((mx / sum, my / sum));
        }
        // Reference: astropy all_world2pix of the star's sky position with the canvas header.
        foreach (var (cx, cy) in centroids)
        {
            Assert.True(Math.Abs(cx - sx) < 0.15 && Math.Abs(cy - sy) < 0.15, $"star centroid ({cx:0.000}, {cy:0.000}) vs astropy ({sx:0.000}, {sy:0.000})");
        }
        Assert.True(Math.Abs(centroids[0].X - centroids[1].X) < 0.15 && Math.Abs(centroids[0].Y - centroids[1].Y) < 0.15,
            $"r ({centroids[0].X:0.000}, {centroids[0].Y:0.000}) vs g ({centroids[1].X:0.000}, {centroids[1].Y:0.000})");
    }

    [Fact]
    public async Task Sky_with_hdu_canvas_gives_the_canvas_centre_and_scale_astropy_reads_from_the_canvas_header()
    {
        var expected = data.Ref.GetProperty("canvas");
        int width = expected.GetProperty("width").GetInt32(), height = expected.GetProperty("height").GetInt32();
        var sky = await SkyAssert.Get(data.Client, $"/api/fields/camera/sky?band=g&hdu=canvas&x0=1&y0=1&x1={width}&y1={height}&width=800&height=400");
        var centre = sky.GetProperty("centre");
        Assert.Equal((1 + width) / 2.0, centre.GetProperty("x").GetDouble());
        Assert.Equal((1 + height) / 2.0, centre.GetProperty("y").GetDouble());
        // Reference: astropy all_pix2world of the canvas centre; proj_plane_pixel_scales for the scale.
        SkyAssert.SamePosition(expected.GetProperty("ra").GetDouble(), expected.GetProperty("dec").GetDouble(),
            centre.GetProperty("ra").GetDouble(), centre.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, "canvas centre");
        Assert.Equal(expected.GetProperty("scaleArcsec").GetDouble(), sky.GetProperty("pixelScale").GetDouble(), 1e-6);
        Assert.NotEmpty(sky.GetProperty("grid").GetProperty("lines").EnumerateArray());
    }

    [Fact]
    public async Task A_field_without_any_WCS_has_no_canvas_and_its_chips_are_served_as_before()
    {
        var blind = await SkyAssert.Get(data.Client, "/api/fields/blind");
        var band = Assert.Single(blind.GetProperty("bands").EnumerateArray());
        Assert.Equal(JsonValueKind.Null, band.GetProperty("canvas").ValueKind);
        Assert.Equal(2, band.GetProperty("hdus").GetArrayLength());
        // Reference: the writer's background formula, 10 k + 0.3 i + 0.2 j + 3 sin(i / 6) cos(j / 9) at 0-based (4, 2) of BLIND2.
        var probe = await SkyAssert.Get(data.Client, "/api/fields/blind/probe?hdu=BLIND2&x=5&y=3");
        Assert.Equal((float)(20 + 0.3 * 4 + 0.2 * 2 + 3 * Math.Sin(4 / 6.0) * Math.Cos(2 / 9.0)), (float)probe.GetProperty("value").GetDouble());
        Assert.False(probe.TryGetProperty("canvas", out _), "a chip probe is unchanged");
        var problem = await SkyAssert.Problem(data.Client, "/api/fields/blind/probe?hdu=canvas&x=5&y=3", HttpStatusCode.NotFound, "hdu");
        Assert.Contains("WCS", problem.GetProperty("detail").GetString());
    }

    [Fact]
    public async Task Field_wide_statistics_stay_those_of_the_chips_while_box_statistics_read_the_canvas()
    {
        // Reference: numpy count of the finite pixels of every image HDU of cam_r.fits as astropy.io.fits reads them,
        // the chip without WCS included and the resampled canvas not.
        var band = await SkyAssert.Get(data.Client, "/api/fields/camera/stats?band=r");
        Assert.Equal(data.Ref.GetProperty("finite").GetProperty("r").GetInt64(), band.GetProperty("count").GetInt64());
        var withCanvas = await SkyAssert.Get(data.Client, "/api/fields/camera/stats?band=r&hdu=canvas");
        Assert.Equal(band.GetProperty("count").GetInt64(), withCanvas.GetProperty("count").GetInt64());

        // A one-pixel box on the canvas holds the resampled value numpy computes by the documented method.
        var p = data.Ref.GetProperty("r").GetProperty("pixels")[0];
        int x = p.GetProperty("canvasX").GetInt32(), y = p.GetProperty("canvasY").GetInt32();
        var box = await SkyAssert.Get(data.Client, $"/api/fields/camera/stats?band=r&hdu=canvas&x0={x}&y0={y}&x1={x}&y1={y}");
        Assert.Equal(1, box.GetProperty("count").GetInt64());
        Assert.Equal(p.GetProperty("value").GetDouble(), box.GetProperty("mean").GetDouble(), 0.02);

        // A box in the gap between CHIP01 and CHIP02 holds no finite pixel.
        var gap = data.Ref.GetProperty("gap");
        int gx = gap.GetProperty("pixelX").GetInt32(), gy = gap.GetProperty("pixelY").GetInt32();
        var empty = await SkyAssert.Get(data.Client, $"/api/fields/camera/stats?band=r&hdu=canvas&x0={gx - 1}&y0={gy - 1}&x1={gx + 1}&y1={gy + 1}");
        Assert.Equal(0, empty.GetProperty("count").GetInt64());
        Assert.Equal(9, empty.GetProperty("masked").GetInt64());
    }

    [Fact]
    public async Task Canvas_pyramids_are_reused_across_restarts_and_rebuilt_for_the_band_whose_file_changed()
    {
        var dataDir = Path.Combine(data.Root, $"restart-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path.Combine(dataDir, "camera"));
        foreach (var file in Directory.GetFiles(Path.Combine(data.DataDirectory, "camera")))
            File.Copy(file, Path.Combine(dataDir, "camera", Path.GetFileName(file)));
        var cache = Path.Combine(data.Root, $"cache-{Guid.NewGuid():N}");
        string[] CanvasFolders() => Directory.GetDirectories(Path.Combine(cache, "pyramids"), "*-canvas-*").Select(Path.GetFileName).Order().ToArray()!;

        using (var first = new MosaicFactory(dataDir, cache))
        using (var client = first.CreateClient())
            await CanvasDataFixture.WaitForCanvasesAsync(client, "camera");
        var built = CanvasFolders();
        Assert.Equal(2, built.Length);

        using var second = new MosaicFactory(dataDir, cache);
        using var again = second.CreateClient();
        // Found in the cache at start: ready at once.
        var listing = await SkyAssert.Get(again, "/api/fields/camera");
        Assert.All(listing.GetProperty("bands").EnumerateArray(),
            b => Assert.Equal("ready", b.GetProperty("canvas").GetProperty("pyramid").GetProperty("state").GetString()));

        // g's file changes (same headers, so the same plan): g's canvas is rebuilt under its new version, r's kept.
        var rVersion = listing.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == "r").GetProperty("version").GetString()!;
        File.SetLastWriteTimeUtc(Path.Combine(dataDir, "camera", "cam_g.fits"), DateTime.UtcNow.AddMinutes(5));
        await Task.Delay(1100); // the catalog rescans at most once a second
        await CanvasDataFixture.WaitForCanvasesAsync(again, "camera");
        var now = CanvasFolders();
        Assert.Equal(3, now.Length);
        Assert.Contains(now, f => f.StartsWith(rVersion, StringComparison.Ordinal));
        Assert.Single(now, f => f.StartsWith(rVersion, StringComparison.Ordinal));
    }

    [Fact]
    public async Task Frames_of_pointings_far_apart_get_no_canvas_and_are_served_one_by_one()
    {
        // Two 100 x 100 frames 10 degrees apart (written with astropy.io.fits): a canvas holding both would be some
        // 36 000 pixels wide and nearly empty.
        var field = await SkyAssert.Get(data.Client, "/api/fields/scattered");
        Assert.Equal(2, field.GetProperty("bands").GetArrayLength());
        Assert.All(field.GetProperty("bands").EnumerateArray(), b => Assert.Equal(JsonValueKind.Null, b.GetProperty("canvas").ValueKind));
        await SkyAssert.Problem(data.Client, "/api/fields/scattered/probe?band=a&hdu=canvas&x=5&y=5", HttpStatusCode.NotFound, "hdu");
        var probe = await SkyAssert.Get(data.Client, "/api/fields/scattered/probe?band=b&x=5&y=5");
        Assert.Equal(0, probe.GetProperty("hdu").GetInt32());
    }
}
