using System.Globalization;
using System.Net;
using System.Text.Json;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>
/// Bands of one chip per file on the whole-field canvas, against astropy.wcs (wcslib; Debian python3-astropy)
/// given the server's canvas header: chip pixel → sky (all_pix2world, origin 1) → canvas pixel (all_world2pix), and
/// sky → chip pixel by all_world2pix on each chip file; astropy.io.fits for the pixel values, numpy for the counts,
/// ImageSharp 2.1 as the outside PNG decoder.
/// </summary>
public sealed class BandCanvasTests(BandFilesFixture data) : IClassFixture<BandFilesFixture>
{
    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    public static TheoryData<string> Bands => new() { "r", "g" };

    [Theory]
    [MemberData(nameof(Bands))]
    public void Every_chip_corner_is_an_outline_vertex_where_astropy_puts_it_on_the_canvas(string band)
    {
        var canvas = data.Band(data.Quad, band).GetProperty("canvas");
        Assert.Equal(data.Ref.GetProperty("canvas").GetProperty("width").GetInt32(), canvas.GetProperty("width").GetInt32());
        Assert.Equal(data.Ref.GetProperty("canvas").GetProperty("height").GetInt32(), canvas.GetProperty("height").GetInt32());
        var chips = canvas.GetProperty("chips").EnumerateArray().ToList();
        foreach (var expected in data.Ref.GetProperty(band).EnumerateArray())
        {
            var chip = chips.Single(c => c.GetProperty("name").GetString() == expected.GetProperty("name").GetString());
            Assert.Equal(expected.GetProperty("index").GetInt32(), chip.GetProperty("hdu").GetInt32());
            var outline = chip.GetProperty("outline").EnumerateArray().Select(p => (X: p[0].GetDouble(), Y: p[1].GetDouble())).ToList();
            foreach (var corner in expected.GetProperty("corners").EnumerateArray())
            {
                double cx = corner[0].GetDouble(), cy = corner[1].GetDouble();
                var nearest = outline.Min(p => Math.Max(Math.Abs(p.X - cx), Math.Abs(p.Y - cy)));
                Assert.True(nearest < 1e-5, $"{band} {expected.GetProperty("name")}: corner ({cx}, {cy}) is {nearest} px from the outline");
            }
        }
    }

    [Theory]
    [MemberData(nameof(Bands))]
    public async Task A_canvas_probe_at_each_chip_centre_names_its_file_and_the_chip_centre_astropy_gives(string band)
    {
        foreach (var expected in data.Ref.GetProperty(band).EnumerateArray())
        {
            var centre = expected.GetProperty("centre");
            var probe = await SkyAssert.Get(data.Client, $"/api/fields/quad/probe?band={band}&hdu=canvas&x={Num(centre[0].GetDouble())}&y={Num(centre[1].GetDouble())}");
            var what = $"{band} {expected.GetProperty("name")}";
            Assert.Equal(expected.GetProperty("index").GetInt32(), probe.GetProperty("hdu").GetInt32());
            Assert.Equal(expected.GetProperty("name").GetString(), probe.GetProperty("hduName").GetString());
            Assert.Equal(expected.GetProperty("file").GetString(), probe.GetProperty("file").GetString());
            // Reference: the chip centre ((W + 1) / 2, (H + 1) / 2) taken to the canvas and back by astropy.
            Assert.True(Math.Abs(expected.GetProperty("centreChip")[0].GetDouble() - probe.GetProperty("atX").GetDouble()) < 1e-6, $"{what}: atX {probe.GetProperty("atX")}");
            Assert.True(Math.Abs(expected.GetProperty("centreChip")[1].GetDouble() - probe.GetProperty("atY").GetDouble()) < 1e-6, $"{what}: atY {probe.GetProperty("atY")}");
        }
    }

    [Theory]
    [MemberData(nameof(Bands))]
    public async Task A_probe_by_RA_Dec_names_the_file_chip_pixel_and_value_astropy_finds(string band)
    {
        foreach (var chip in data.Ref.GetProperty(band).EnumerateArray())
            foreach (var p in chip.GetProperty("points").EnumerateArray())
            {
                double ra = p.GetProperty("ra").GetDouble(), dec = p.GetProperty("dec").GetDouble();
                var what = $"{band} ({ra}, {dec})";
                // Without hdu the band's chip holding the position is found; with hdu=canvas through the canvas.
                foreach (var hdu in new[] { "", "&hdu=canvas" })
                {
                    var probe = await SkyAssert.Get(data.Client, $"/api/fields/quad/probe?band={band}{hdu}&ra={Num(ra)}&dec={Num(dec)}");
                    Assert.Equal(chip.GetProperty("file").GetString(), probe.GetProperty("file").GetString());
                    Assert.Equal(chip.GetProperty("index").GetInt32(), probe.GetProperty("hdu").GetInt32());
                    // Reference: astropy all_world2pix on the chip (tolerance 1e-12), the pixel holding it and its float32 value.
                    Assert.True(Math.Abs(p.GetProperty("x").GetDouble() - probe.GetProperty("atX").GetDouble()) < 1e-6, $"{what}{hdu}: atX {probe.GetProperty("atX")} vs {p.GetProperty("x")}");
                    Assert.True(Math.Abs(p.GetProperty("y").GetDouble() - probe.GetProperty("atY").GetDouble()) < 1e-6, $"{what}{hdu}: atY {probe.GetProperty("atY")} vs {p.GetProperty("y")}");
                    Assert.Equal(p.GetProperty("px").GetInt32(), probe.GetProperty("x").GetInt32());
                    Assert.Equal(p.GetProperty("py").GetInt32(), probe.GetProperty("y").GetInt32());
                    Assert.Equal(p.GetProperty("value").GetDouble(), probe.GetProperty("value").GetDouble());
                    var fitsIndex = chip.GetProperty("fitsIndex").GetInt32();
                    if (fitsIndex != chip.GetProperty("index").GetInt32()) Assert.Equal(fitsIndex, probe.GetProperty("fitsIndex").GetInt32());
                }
            }
    }

    [Fact]
    public async Task Band_wide_statistics_count_every_chip_of_every_file()
    {
        foreach (var band in new[] { "r", "g" })
        {
            // Reference: numpy's count of the finite pixels of the band's four files as astropy.io.fits reads them.
            var stats = await SkyAssert.Get(data.Client, $"/api/fields/quad/stats?band={band}");
            Assert.Equal(data.Written.GetProperty("finite").GetProperty($"quad_{band}").GetInt64(), stats.GetProperty("count").GetInt64());
            Assert.Equal(4, stats.GetProperty("masked").GetInt64()); // one NaN written per chip
        }
    }

    [Fact]
    public async Task A_composite_of_two_bands_of_chip_files_puts_the_star_where_astropy_does_in_both_channels()
    {
        var star = data.Ref.GetProperty("star");
        double sx = star.GetProperty("canvasX").GetDouble(), sy = star.GetProperty("canvasY").GetDouble();
        int x0 = (int)Math.Round(sx) - 10, y0 = (int)Math.Round(sy) - 10, x1 = x0 + 20, y1 = y0 + 20;
        // Each channel's lower limit is above its band's background under the star (the writer's formula, ~1150 in
        // r and ~660 in g), its upper limit above the star's peak: only the star shows, unsaturated.
        var url = $"/api/fields/quad/render.png?rgb=each&red=r&green=g&blue=g&hdu=canvas&stretch=linear&red-lo=1300&red-hi=5400&green-lo=800&green-hi=4900&blue-lo=800&blue-hi=4900&x0={x0}&y0={y0}&x1={x1}&y1={y1}";
        var response = await data.Client.GetAsync(url);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {(int)response.StatusCode} {System.Text.Encoding.UTF8.GetString(bytes)}");
        using var image = Image.Load<Rgba32>(bytes);
        var red = Centroid(image, x0, y1, p => p.R);
        var green = Centroid(image, x0, y1, p => p.G);
        // Reference: astropy all_world2pix of the star's sky position with the canvas header.
        foreach (var (name, c) in new[] { ("red (r)", red), ("green (g)", green) })
            Assert.True(Math.Abs(c.X - sx) < 0.15 && Math.Abs(c.Y - sy) < 0.15, $"{name} centroid ({c.X:0.000}, {c.Y:0.000}) vs astropy ({sx:0.000}, {sy:0.000})");
    }

    private static (double X, double Y) Centroid(Image<Rgba32> image, int x0, int y1, Func<Rgba32, byte> channel)
    {
        double sum = 0, mx = 0, my = 0;
        for (var row = 0; row < image.Height; row++)
            for (var col = 0; col < image.Width; col++)
            {
                double w = channel(image[col, row]);
                sum += w;
                mx += w * (x0 + col);
                my += w * (y1 - row); // the PNG's top row is y1
            }
        Assert.True(sum > 255 * 5, "the star shows");
        return (mx / sum, my / sum);
    }
}
