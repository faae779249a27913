using System.Globalization;
using System.Text.Json;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class MarkerTests(MosaicSite site)
{
    // Indices into a circle's outline (96 vertices from the east, counter-clockwise on the sky): east, north, west, south.
    private static readonly int[] CircleQuarters = [0, 24, 48, 72];

    [Fact]
    public async Task Each_kind_placed_by_click_is_drawn_at_astropys_pixel_for_its_sky_position_and_sized_on_the_sky()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var (cx, cy, z) = (hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom + 1.0);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var markers = new MarkerControls(viewer);
        var mapping = await TileMapping.ReadAsync(viewer, hdu.Height, Math.Pow(2, z - hdu.MaxZoom));

        // On the chip (512 screen pixels wide in the middle of the view), left of the panel, clear of the compass and readout.
        (string Kind, double X, double Y)[] clicks = [("point", 260, 210), ("circle", 330, 400), ("box", 440, 520)];
        await markers.ChooseAsync("point", "first star");
        await markers.SetPlacingAsync(true);
        var clicked = new List<ScreenPoint>();
        foreach (var (kind, x, y) in clicks)
        {
            await markers.ChooseAsync(kind, $"{kind} by click", radius: 4, width: 8, height: 5);
            clicked.Add(await markers.ClickAsync(x, y));
        }
        await markers.SetPlacingAsync(false);

        var tokens = MarkerToken.FromUrl(viewer.Page.Url);
        Assert.Equal(["p", "c", "b"], tokens.Select(t => t.Letter.ToString()));
        Assert.Equal(["point by click", "circle by click", "box by click"], tokens.Select(t => t.Label));
        var drawn = await markers.DrawnAsync();
        Assert.Equal(3, drawn.Count);
        for (var i = 0; i < clicks.Length; i++)
        {
            var token = tokens[i];
            var (ra, dec) = (token.Numbers[0], token.Numbers[1]);
            var offsets = clicks[i].Kind switch
            {
                "circle" => new[] { (4.0, 0.0), (0.0, 4.0), (-4.0, 0.0), (0.0, -4.0) },
                "box" => [(-4.0, -2.5), (4.0, -2.5), (4.0, 2.5), (-4.0, 2.5)],
                _ => [],
            };
            // astropy (Debian python3-astropy): all_world2pix of the marker's RA/Dec and of points offset from it
            // on the sky (SkyCoord.spherical_offsets_by).
            var reference = SkyOffsets.Compute(file, hdu.Index, ra, dec, offsets);

            // The click's sky position, stored to 1e-7° (0.0014 pixel at 0.25″), names the point clicked: to a fifth
            // of a screen pixel (a tenth of an image pixel here), as the browser hands the page the click's position.
            var at = mapping.ToFits(clicked[i].X, clicked[i].Y);
            Assert.Equal(at.X, reference.Centre.X, 0.1);
            Assert.Equal(at.Y, reference.Centre.Y, 0.1);
            // Drawn at astropy's pixel for that RA/Dec, and on screen where that pixel is (Leaflet rounds to a whole pixel).
            Assert.Equal(reference.Centre.X, drawn[i].X, 0.01);
            Assert.Equal(reference.Centre.Y, drawn[i].Y, 0.01);
            var expected = mapping.ToContainer(reference.Centre.X, reference.Centre.Y);
            Assert.True(Math.Abs(drawn[i].Screen.X - expected.X) <= 1.5 && Math.Abs(drawn[i].Screen.Y - expected.Y) <= 1.5,
                $"{clicks[i].Kind} drawn at ({drawn[i].Screen.X}, {drawn[i].Screen.Y}), astropy's pixel is at ({expected.X}, {expected.Y})");

            // Sizes on the sky: the outline's east/north extremes (circle) or corners (box) are astropy's offset points.
            var outline = drawn[i].Outline;
            var vertices = clicks[i].Kind == "circle" ? CircleQuarters.Select(k => outline[k]).ToList() : outline.ToList();
            Assert.Equal(reference.Offsets.Count, vertices.Count);
            for (var k = 0; k < vertices.Count; k++)
            {
                Assert.True(Math.Abs(vertices[k].X - reference.Offsets[k].X) <= 0.05 && Math.Abs(vertices[k].Y - reference.Offsets[k].Y) <= 0.05,
                    $"{clicks[i].Kind} vertex {k} at ({vertices[k].X}, {vertices[k].Y}), astropy ({reference.Offsets[k].X}, {reference.Offsets[k].Y})");
            }
        }

        // The outlines as drawn on screen span what their vertices span (the 2 px stroke aside).
        for (var nth = 0; nth < 2; nth++)
        {
            var outline = drawn[nth + 1].Outline.Select(p => mapping.ToContainer(p.X, p.Y)).ToList();
            var box = await markers.ShapeBoxAsync(nth);
            Assert.Equal(outline.Max(p => p.X) - outline.Min(p => p.X), box.Width, 3.0);
            Assert.Equal(outline.Max(p => p.Y) - outline.Min(p => p.Y), box.Height, 3.0);
            Assert.Equal(outline.Min(p => p.X), box.X, 2.0);
            Assert.Equal(outline.Min(p => p.Y), box.Y, 2.0);
        }
        // A 4″ circle at ~0.25″ a pixel, two screen pixels per image pixel: about 64 screen pixels across.
        var circle = await markers.ShapeBoxAsync(0);
        Assert.InRange(circle.Width, 55, 72);
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/markers-by-click.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Typed_positions_sexagesimal_or_decimal_land_on_astropys_pixel_on_any_chip_and_on_the_whole_field()
    {
        var band = site.Demo.DefaultBand;
        var hdus = site.Demo.Band(band).Hdus;
        var shown = hdus.Single(h => h.Index == site.Demo.DefaultHdu);
        var other = hdus.Last(h => h.Index != shown.Index);
        var file = site.BandFile(band);
        // Off pixel centres, so landing on a centre would not pass for landing on the position.
        (HduInfo Hdu, double X, double Y)[] places =
        [
            (shown, shown.Width * 0.4 + 0.3, shown.Height * 0.45 - 0.2),
            (shown, shown.Width * 0.55 - 0.35, shown.Height * 0.6 + 0.15),
            (other, other.Width * 0.5 + 0.1, other.Height * 0.5 - 0.4),
        ];
        // astropy.wcs all_pix2world (Debian python3-astropy): the sky positions of those points.
        var sky = places.Select(p => AstropyWcs.PixelToSky(file, p.Hdu.Index, p.X, p.Y)).ToList();

        var z = shown.MaxZoom;
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, shown.Index, shown.Width / 2.0, shown.Height / 2.0, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var markers = new MarkerControls(viewer);
        await markers.ChooseAsync("point", "decimal");
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{sky[0].Ra:F8} {sky[0].Dec:F8}"));
        await markers.ChooseAsync("circle", "sexagesimal", radius: 3);
        await markers.AddTypedAsync($"{Sexagesimal.FormatRa(sky[1].Ra, 4)} {Sexagesimal.FormatDec(sky[1].Dec, 3)}");
        await markers.ChooseAsync("box", "other chip", width: 6, height: 4);
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{sky[2].Ra:F8} {sky[2].Dec:F8}"));

        // The third lies on another chip: listed, not drawn here.
        var drawn = await markers.DrawnAsync();
        Assert.Equal([0, 1], drawn.Select(d => d.Index));
        Assert.Equal("false", await viewer.Page.GetAttributeAsync("#marker-panel .marker-row[data-index='2']", "data-on"));
        // 1e-8° typed, stored to 1e-7° (0.0014 pixel); 0.0001 s and 0.001″ sexagesimal: a few thousandths of a pixel.
        for (var i = 0; i < 2; i++)
        {
            Assert.Equal(places[i].X, drawn[i].X, 0.02);
            Assert.Equal(places[i].Y, drawn[i].Y, 0.02);
        }

        // On the other chip the box is drawn, at its pixel there.
        await viewer.Page.SelectOptionAsync("#hdu-picker", other.Index.ToString(CultureInfo.InvariantCulture));
        await viewer.WaitForTilesAsync($"hdu={other.Index}");
        await markers.WaitForPlacedAsync(3);
        var there = await markers.DrawnAsync();
        var box = Assert.Single(there);
        Assert.Equal(2, box.Index);
        Assert.Equal(places[2].X, box.X, 0.02);
        Assert.Equal(places[2].Y, box.Y, 0.02);

        // On the whole field all three are drawn; each canvas position, probed, is on the chip astropy puts it on.
        await viewer.Page.SelectOptionAsync("#hdu-picker", "canvas");
        await viewer.WaitForTilesAsync("hdu=canvas");
        await markers.WaitForPlacedAsync(3);
        var onField = await markers.DrawnAsync();
        Assert.Equal([0, 1, 2], onField.Select(d => d.Index));
        for (var i = 0; i < 3; i++)
        {
            var probe = await site.GetJsonAsync(string.Create(CultureInfo.InvariantCulture,
                $"api/fields/{site.Demo.Id}/probe?band={band}&hdu=canvas&x={onField[i].X:R}&y={onField[i].Y:R}"));
            Assert.Equal(places[i].Hdu.Index, probe.GetProperty("hdu").GetInt32());
            Assert.Equal(places[i].X, probe.GetProperty("atX").GetDouble(), 0.05);
            Assert.Equal(places[i].Y, probe.GetProperty("atY").GetDouble(), 0.05);
        }
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/markers-whole-field.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Markers_survive_a_link_opened_in_a_second_browser_context()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var a = AstropyWcs.PixelToSky(file, hdu.Index, hdu.Width * 0.3, hdu.Height * 0.4);
        var b = AstropyWcs.PixelToSky(file, hdu.Index, hdu.Width * 0.6, hdu.Height * 0.55);
        await using var first = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom).ToQuery());
        await first.WaitForTilesAsync();
        var markers = new MarkerControls(first);
        // A label with the URL format's own separators and a comma, which must all come back as typed.
        await markers.ChooseAsync("circle", "knot_2 * 50% ,east", radius: 2.5);
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{a.Ra:F8} {a.Dec:F8}"));
        await markers.ChooseAsync("box", "", width: 7.25, height: 3);
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{b.Ra:F8} {b.Dec:F8}"));
        var drawn = await markers.DrawnAsync();
        var link = first.Page.Url;

        await using var second = await site.OpenViewerAsync(new Uri(link).Query);
        await second.WaitForTilesAsync();
        var opened = new MarkerControls(second);
        await opened.WaitForPlacedAsync(2);
        var again = await opened.DrawnAsync();
        Assert.Equal(drawn.Count, again.Count);
        for (var i = 0; i < drawn.Count; i++)
        {
            Assert.Equal(drawn[i].X, again[i].X, 1e-6);
            Assert.Equal(drawn[i].Y, again[i].Y, 1e-6);
            Assert.Equal(drawn[i].Outline.Count, again[i].Outline.Count);
        }
        var tokens = MarkerToken.FromUrl(second.Page.Url);
        Assert.Equal(["knot_2 * 50% ,east", ""], tokens.Select(t => t.Label));
        Assert.Equal([2.5], tokens[0].Numbers.Skip(2));
        Assert.Equal([7.25, 3.0], tokens[1].Numbers.Skip(2));
        await opened.OpenAsync();
        Assert.Equal("knot_2 * 50% ,east", await second.Page.InputValueAsync("#marker-panel .marker-row[data-index='0'] .marker-row-label"));

        // Removed in the second page: gone from its URL, kept in the first.
        await second.Page.ClickAsync("#marker-panel .marker-row[data-index='0'] [data-role=remove]");
        await opened.WaitForPlacedAsync(1);
        Assert.Single(MarkerToken.FromUrl(second.Page.Url));
        Assert.Equal(2, MarkerToken.FromUrl(first.Page.Url).Count);
        Assert.Empty(first.PageErrors);
        Assert.Empty(second.PageErrors);
    }

    [Fact]
    public async Task Csv_and_json_downloads_hold_each_markers_sky_position_sizes_and_pixel()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        (double X, double Y)[] pixels = [(hdu.Width * 0.35 + 0.2, hdu.Height * 0.3 - 0.1), (hdu.Width * 0.5, hdu.Height * 0.5), (hdu.Width * 0.7 - 0.3, hdu.Height * 0.65)];
        // astropy.wcs all_pix2world (Debian python3-astropy).
        var sky = AstropyWcs.PixelToSky(file, hdu.Index, pixels);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom).ToQuery());
        await viewer.WaitForTilesAsync();
        var markers = new MarkerControls(viewer);
        string[] kinds = ["point", "circle", "box"];
        string[] labels = ["plain", "with, comma", "with \"quotes\""];
        for (var i = 0; i < 3; i++)
        {
            await markers.ChooseAsync(kinds[i], labels[i], radius: 3.5, width: 12, height: 4.5);
            await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{sky[i].Ra:F9} {sky[i].Dec:F9}"));
        }
        var drawn = await markers.DrawnAsync();

        var (csvName, csv) = await markers.DownloadAsync("csv");
        Assert.EndsWith(".csv", csvName, StringComparison.Ordinal);
        var rows = CsvRecords.Parse(csv);
        Assert.Equal(["kind", "label", "ra_deg", "dec_deg", "ra_hms", "dec_dms", "radius_arcsec", "width_arcsec", "height_arcsec",
            "radius_px", "width_px", "height_px", "image", "x", "y"], rows[0]);
        Assert.Equal(4, rows.Count);
        var (jsonName, json) = await markers.DownloadAsync("json");
        Assert.EndsWith(".json", jsonName, StringComparison.Ordinal);
        var document = JsonDocument.Parse(json).RootElement;
        Assert.Equal(site.Demo.Id, document.GetProperty("field").GetString());
        var records = document.GetProperty("markers").EnumerateArray().ToList();
        Assert.Equal(3, records.Count);

        for (var i = 0; i < 3; i++)
        {
            var row = rows[i + 1];
            var column = (string name) => row[Array.IndexOf(rows[0], name)];
            // astropy's own sexagesimal (Angle.to_string) of the position kept, to 1 ms and 0.01″.
            var reference = SkyOffsets.Compute(file, hdu.Index, Parse(column("ra_deg")), Parse(column("dec_deg")));
            Assert.Equal(kinds[i], column("kind"));
            Assert.Equal(labels[i], column("label"));
            // Typed to 1e-9°, kept to 1e-7°.
            Assert.Equal(sky[i].Ra, Parse(column("ra_deg")), 1e-7);
            Assert.Equal(sky[i].Dec, Parse(column("dec_deg")), 1e-7);
            Assert.Equal(reference.RaHours, column("ra_hms"));
            Assert.Equal(reference.DecDegrees, column("dec_dms"));
            Assert.Equal(i == 1 ? "3.5" : "", column("radius_arcsec"));
            Assert.Equal(i == 2 ? "12" : "", column("width_arcsec"));
            Assert.Equal(i == 2 ? "4.5" : "", column("height_arcsec"));
            Assert.Equal(hdu.Index.ToString(CultureInfo.InvariantCulture), column("image"));
            // The pixel on the image shown: astropy's pixel for the position, which is where the page drew it.
            Assert.Equal(pixels[i].X, Parse(column("x")), 0.01);
            Assert.Equal(pixels[i].Y, Parse(column("y")), 0.01);
            Assert.Equal(drawn[i].X, Parse(column("x")), 0.001);

            var record = records[i];
            Assert.Equal(kinds[i], record.GetProperty("kind").GetString());
            Assert.Equal(labels[i], record.GetProperty("label").GetString());
            Assert.Equal(sky[i].Ra, record.GetProperty("ra").GetDouble(), 1e-7);
            Assert.Equal(sky[i].Dec, record.GetProperty("dec").GetDouble(), 1e-7);
            Assert.Equal(reference.RaHours, record.GetProperty("raSexagesimal").GetString());
            Assert.Equal(reference.DecDegrees, record.GetProperty("decSexagesimal").GetString());
            Assert.Equal(pixels[i].X, record.GetProperty("x").GetDouble(), 0.01);
            Assert.Equal(pixels[i].Y, record.GetProperty("y").GetDouble(), 0.01);
        }
        Assert.Equal(3.5, records[1].GetProperty("radiusArcsec").GetDouble());
        Assert.Equal(12, records[2].GetProperty("widthArcsec").GetDouble());
        Assert.Equal(JsonValueKind.Null, records[0].GetProperty("radiusArcsec").ValueKind);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task On_an_image_without_wcs_markers_are_placed_and_kept_in_pixels()
    {
        var field = await site.WaitForFieldAsync(MosaicSite.UnsolvedFieldId);
        var band = field.Bands[0];
        var hdu = band.Hdus[0];
        // The image is smaller than the view: the map keeps it in the middle, so the centre is the image's.
        var (cx, cy, z) = (hdu.Width / 2.0 + 0.5, hdu.Height / 2.0 + 0.5, hdu.MaxZoom + 2.0);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(field.Id, band.Name, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var markers = new MarkerControls(viewer);
        var mapping = await TileMapping.ReadAsync(viewer, hdu.Height, Math.Pow(2, z - hdu.MaxZoom));
        await markers.ChooseAsync("circle", "in pixels", radius: 6);
        Assert.Equal("px", (await viewer.Page.TextContentAsync("#marker-panel [data-size=radius] [data-role=unit]"))?.Trim());
        await markers.SetPlacingAsync(true);
        var point = await markers.ClickAsync(400, 330);
        await markers.SetPlacingAsync(false);
        // And typed as pixels: "x y".
        await markers.ChooseAsync("point", "typed");
        await markers.AddTypedAsync("20.5 30.25");

        var tokens = MarkerToken.FromUrl(viewer.Page.Url);
        Assert.Equal(['C', 'P'], tokens.Select(t => t.Letter));
        Assert.Equal(hdu.Index.ToString(CultureInfo.InvariantCulture), tokens[0].Hdu);
        // Where the click was, by the pixel CRS contract (read off the tiles); kept to 0.01.
        var clicked = mapping.ToFits(point.X, point.Y);
        var drawn = await markers.DrawnAsync();
        // To a fifth of a screen pixel (0.05 image pixel here), as the browser hands the page the click's position.
        Assert.Equal(clicked.X, drawn[0].X, 0.05);
        Assert.Equal(clicked.Y, drawn[0].Y, 0.05);
        Assert.Equal(20.5, drawn[1].X);
        Assert.Equal(30.25, drawn[1].Y);
        // A radius of 6 pixels along the pixel axes.
        Assert.Equal(drawn[0].X + 6, drawn[0].Outline[0].X, 1e-9);
        Assert.Equal(drawn[0].Y + 6, drawn[0].Outline[24].Y, 1e-9);

        var (_, csv) = await markers.DownloadAsync("csv");
        var rows = CsvRecords.Parse(csv);
        var column = (int row, string name) => rows[row][Array.IndexOf(rows[0], name)];
        Assert.Equal("", column(1, "ra_deg"));
        Assert.Equal("6", column(1, "radius_px"));
        Assert.Equal(drawn[0].X, Parse(column(1, "x")), 1e-9);
        Assert.Equal("30.25", column(2, "y"));
        Assert.Empty(viewer.PageErrors);
    }

    private static double Parse(string text) => double.Parse(text, CultureInfo.InvariantCulture);
}
