using System.Globalization;
using System.Net;
using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Server.Sky;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

/// <summary>
/// /sky: grid lines, compass and scale against astropy.wcs (wcslib) and astropy.coordinates.Angle, from Debian's
/// python3-astropy, for a rotated TAN field, a TAN-SIP field, a field across RA = 0 and one holding the north pole.
/// </summary>
public sealed class SkyGridTests(SkyDataFixture data) : IClassFixture<SkyDataFixture>
{
    /// <summary>Views of Reference/sky_fixture.py: a rotated TAN, a TAN-SIP, across RA = 0, the pole inside, the pole just outside.</summary>
    private static readonly string[] Views = ["tan", "sip", "wrap", "pole", "poleNear"];

    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private string FieldOf(string view) => data.Ref.GetProperty("views").GetProperty(view).GetProperty("field").GetString()!;

    private string SkyUrl(string view)
    {
        var b = data.Ref.GetProperty("views").GetProperty(view).GetProperty("box").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        return $"/api/fields/{FieldOf(view)}/sky?x0={Num(b[0])}&y0={Num(b[1])}&x1={Num(b[2])}&y1={Num(b[3])}&width={Num(b[4])}&height={Num(b[5])}";
    }

    private ViewBox Box(string view)
    {
        var b = data.Ref.GetProperty("views").GetProperty(view).GetProperty("box").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        return new ViewBox(b[0], b[1], b[2], b[3], b[4], b[5]);
    }

    private static PixelPoint Point(JsonElement p) => new(p[0].GetDouble(), p[1].GetDouble());

    [Fact]
    public async Task Every_grid_point_lies_on_its_line_and_every_chord_stays_within_half_a_screen_pixel_of_it()
    {
        var answers = new Dictionary<string, JsonElement>();
        var request = new JsonArray();
        foreach (var view in Views)
        {
            var sky = await SkyAssert.Get(data.Client, SkyUrl(view));
            answers[view] = sky;
            request.Add(new JsonObject
            {
                ["file"] = Path.Combine(data.DataDirectory, FieldOf(view) + ".fits"),
                ["hdu"] = 0,
                ["lines"] = JsonNode.Parse(sky.GetProperty("grid").GetProperty("lines").GetRawText()),
            });
        }
        // One run of Reference/grid_check.py for every point of every field: astropy all_pix2world of each point,
        // all_world2pix of the line's point halfway (in its running coordinate) between consecutive points, and
        // astropy.coordinates.Angle of each label.
        var checkedJson = DebianPython.RunFile(SkyDataFixture.Script("grid_check.py"), standardInput: new JsonObject { ["fields"] = request }.ToJsonString());
        using var check = JsonDocument.Parse(checkedJson);

        for (var f = 0; f < Views.Length; f++)
        {
            var field = Views[f];
            var box = Box(field);
            var region = box.Grown(SkyGrid.MarginFraction * Math.Max(box.Width, box.Height));
            var lines = answers[field].GetProperty("grid").GetProperty("lines");
            Assert.True(lines.GetArrayLength() >= 4, $"{field}: only {lines.GetArrayLength()} grid lines");
            var points = 0;
            for (var l = 0; l < lines.GetArrayLength(); l++)
            {
                var line = lines[l];
                var reference = check.RootElement[f][l];
                var axis = line.GetProperty("axis").GetString();
                var value = line.GetProperty("value").GetDouble();
                var label = line.GetProperty("label").GetString()!;
                var what = $"{field} {axis} {label}";
                // The label reads back (astropy Angle, hours for RA) as the line's value.
                var labelled = reference.GetProperty("labelDegrees").GetDouble();
                Assert.True(Math.Abs(axis == "ra" ? SkyAssert.RaDifference(labelled, value) : labelled - value) < 1e-9, $"{what}: label means {labelled}");

                var segments = line.GetProperty("segments");
                Assert.True(segments.GetArrayLength() > 0, what);
                for (var s = 0; s < segments.GetArrayLength(); s++)
                {
                    var segment = segments[s];
                    var world = reference.GetProperty("segments")[s].GetProperty("world");
                    var mids = reference.GetProperty("segments")[s].GetProperty("midPixels");
                    Assert.True(segment.GetArrayLength() >= 2, what);
                    for (var k = 0; k < segment.GetArrayLength(); k++)
                    {
                        points++;
                        var p = Point(segment[k]);
                        Assert.True(region.Contains(p.X + 1e-6 * Math.Sign(box.Centre.X - p.X), p.Y + 1e-6 * Math.Sign(box.Centre.Y - p.Y)), $"{what}: ({p.X}, {p.Y}) lies outside the view and its margin");
                        double ra = world[k][0].GetDouble(), dec = world[k][1].GetDouble();
                        if (axis == "ra")
                        {
                            // Near a pole RA is ill-conditioned (at the pole it has no meaning): there the angular offset
                            // across the meridian, ΔRA cos δ, is what must be small.
                            var dRa = Math.Abs(SkyAssert.RaDifference(ra, value));
                            var offset = Math.Abs(dec) < 80 ? dRa : dRa * Math.Cos(dec * Math.PI / 180);
                            Assert.True(offset <= 1e-6, $"{what}: point {k} ({p.X}, {p.Y}) has RA {ra:R} by astropy");
                        }
                        else
                        {
                            Assert.True(Math.Abs(dec - value) <= 1e-6, $"{what}: point {k} ({p.X}, {p.Y}) has Dec {dec:R} by astropy");
                        }
                        if (k == 0) continue;
                        var a = Point(segment[k - 1]);
                        // No jumps: consecutive points are close on the screen, and the curve between them stays
                        // within half a screen pixel of the chord (0.01 px allowed for the two libraries' rounding).
                        Assert.True(box.ScreenDistance(a, p) <= 10 + 1e-6, $"{what}: points {k - 1} and {k} are {box.ScreenDistance(a, p):0.##} screen px apart");
                        var mid = Point(mids[k - 1]);
                        var miss = ChordDistance(box, a, p, mid);
                        Assert.True(miss <= 0.51, $"{what}: between points {k - 1} and {k} the line runs {miss:0.###} screen px from the chord");
                    }
                }
                if (line.GetProperty("labelAt").ValueKind != JsonValueKind.Null)
                {
                    var at = Point(line.GetProperty("labelAt"));
                    Assert.True(box.Contains(at.X, at.Y), $"{what}: label at ({at.X}, {at.Y}) lies outside the view");
                }
            }
            Assert.True(points > 100, $"{field}: {points} points");
        }
    }

    /// <summary>Screen distance from <paramref name="p"/> to the segment from <paramref name="a"/> to <paramref name="b"/>.</summary>
    private static double ChordDistance(ViewBox box, PixelPoint a, PixelPoint b, PixelPoint p)
    {
        double bx = (b.X - a.X) * box.ScaleX, by = (b.Y - a.Y) * box.ScaleY;
        double px = (p.X - a.X) * box.ScaleX, py = (p.Y - a.Y) * box.ScaleY;
        var length2 = bx * bx + by * by;
        var t = length2 > 0 ? Math.Clamp((px * bx + py * by) / length2, 0, 1) : 0;
        return Math.Sqrt((px - t * bx) * (px - t * bx) + (py - t * by) * (py - t * by));
    }

    [Theory]
    [InlineData("tan")]
    [InlineData("sip")]
    [InlineData("wrap")]
    [InlineData("pole")]
    [InlineData("poleNear")]
    public async Task Centre_north_east_and_pixel_scale_match_finite_differences_of_astropy(string field)
    {
        var sky = await SkyAssert.Get(data.Client, SkyUrl(field));
        // Reference: astropy all_pix2world at the box centre and ±0.5 px, turned into the local east/north frame
        // on the unit sphere (Reference/sky_fixture.py, local_frame).
        var frame = data.Ref.GetProperty("views").GetProperty(field).GetProperty("frame");
        var centre = sky.GetProperty("centre");
        Assert.Equal(frame.GetProperty("x").GetDouble(), centre.GetProperty("x").GetDouble());
        Assert.Equal(frame.GetProperty("y").GetDouble(), centre.GetProperty("y").GetDouble());
        SkyAssert.SamePosition(frame.GetProperty("ra").GetDouble(), frame.GetProperty("dec").GetDouble(),
            centre.GetProperty("ra").GetDouble(), centre.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, $"{field} centre");
        // Reference: astropy Angle.to_string (sep ':', 3 decimals of RA seconds, 2 of Dec seconds, signed Dec).
        Assert.Equal(frame.GetProperty("raText").GetString(), centre.GetProperty("raSexagesimal").GetString());
        Assert.Equal(frame.GetProperty("decText").GetString(), centre.GetProperty("decSexagesimal").GetString());
        foreach (var (name, vector) in new[] { ("north", sky.GetProperty("north")), ("east", sky.GetProperty("east")) })
        {
            var expected = frame.GetProperty(name);
            Assert.Equal(expected[0].GetDouble(), vector.GetProperty("dx").GetDouble(), 1e-6);
            Assert.Equal(expected[1].GetDouble(), vector.GetProperty("dy").GetDouble(), 1e-6);
        }
        var scale = sky.GetProperty("pixelScale").GetDouble();
        Assert.Equal(frame.GetProperty("scale").GetDouble(), scale, 1e-6 * scale);
        if (field is "tan" or "wrap" or "pole")
        {
            // Reference: astropy.wcs.utils.proj_plane_pixel_scales; at (or half a pixel from) CRPIX of a TAN header
            // with square pixels the local scale is the CD matrix's.
            foreach (var s in data.Ref.GetProperty("scales").GetProperty(FieldOf(field)).GetProperty("planeScales").EnumerateArray())
                Assert.Equal(s.GetDouble(), scale, 1e-6 * scale);
        }
    }

    [Fact]
    public async Task A_view_just_beside_the_pole_gets_the_meridians_fanning_out_from_it()
    {
        var grid = (await SkyAssert.Get(data.Client, SkyUrl("poleNear"))).GetProperty("grid");
        var box = Box("poleNear");
        // Reference: astropy all_world2pix of (0°, +90°), 50 px above this view.
        var pole = Point(data.Ref.GetProperty("views").GetProperty("pole").GetProperty("poleAt"));
        Assert.False(box.Contains(pole.X, pole.Y));
        var meridians = grid.GetProperty("lines").EnumerateArray().Where(l => l.GetProperty("axis").GetString() == "ra").ToList();
        Assert.InRange(meridians.Count, 3, 8);
        // Each meridian, followed on towards the pole, points at it: the last two points of the segment nearest
        // the pole line up with it (within a degree) — the lines radiate from the pole, none jumps across.
        foreach (var meridian in meridians)
        {
            var segment = meridian.GetProperty("segments").EnumerateArray()
                .MinBy(s => s.EnumerateArray().Select(Point).Min(p => box.ScreenDistance(p, pole)));
            var pts = segment.EnumerateArray().Select(Point).ToList();
            var (near, before) = box.ScreenDistance(pts[0], pole) < box.ScreenDistance(pts[^1], pole) ? (pts[0], pts[1]) : (pts[^1], pts[^2]);
            var along = Math.Atan2(near.Y - before.Y, near.X - before.X);
            var towards = Math.Atan2(pole.Y - near.Y, pole.X - near.X);
            var miss = Math.Abs(Math.IEEERemainder(along - towards, 2 * Math.PI)) * 180 / Math.PI;
            Assert.True(miss < 1, $"meridian {meridian.GetProperty("label").GetString()} heads {miss:0.##}° off the pole");
        }
    }

    [Fact]
    public async Task A_rotated_TAN_view_gets_nice_steps_and_three_to_eight_lines_each_way()
    {
        var grid = (await SkyAssert.Get(data.Client, SkyUrl("tan"))).GetProperty("grid");
        var lines = grid.GetProperty("lines").EnumerateArray().ToList();
        var ra = lines.Count(l => l.GetProperty("axis").GetString() == "ra");
        var dec = lines.Count(l => l.GetProperty("axis").GetString() == "dec");
        Assert.InRange(ra, 3, 8);
        Assert.InRange(dec, 3, 8);
        // Steps come from the nice sequences (RA in h/m/s, Dec in °/′/″; 1° of RA = 240 s of time).
        Assert.Contains(Math.Round(grid.GetProperty("raStep").GetDouble() * 240 * 100, 6), GridSpacing.RaSteps.Select(s => (double)s));
        Assert.Contains(Math.Round(grid.GetProperty("decStep").GetDouble() * 360_000, 6), GridSpacing.DecSteps.Select(s => (double)s));
        // Every value is a whole number of steps.
        foreach (var line in lines)
        {
            var step = grid.GetProperty(line.GetProperty("axis").GetString() == "ra" ? "raStep" : "decStep").GetDouble();
            var k = line.GetProperty("value").GetDouble() / step;
            Assert.Equal(Math.Round(k), k, 1e-9);
        }
    }

    [Fact]
    public async Task A_view_across_RA_0_gets_short_RA_steps_with_meridians_on_both_sides_of_0h()
    {
        var grid = (await SkyAssert.Get(data.Client, SkyUrl("wrap"))).GetProperty("grid");
        // The box is 40′ × 30′ at Dec +10°: a span of minutes of RA, not a day (a naive min/max would see 360°).
        Assert.True(grid.GetProperty("raStep").GetDouble() < 1, $"raStep {grid.GetProperty("raStep").GetDouble()}");
        var ras = grid.GetProperty("lines").EnumerateArray().Where(l => l.GetProperty("axis").GetString() == "ra")
            .Select(l => l.GetProperty("value").GetDouble()).ToList();
        Assert.Contains(ras, v => v > 359);
        Assert.Contains(ras, v => v < 1);
        Assert.InRange(ras.Count, 3, 8);
    }

    [Fact]
    public async Task A_view_holding_the_pole_gets_every_meridian_meeting_at_it()
    {
        var sky = await SkyAssert.Get(data.Client, SkyUrl("pole"));
        var grid = sky.GetProperty("grid");
        var box = Box("pole");
        // Reference: astropy all_world2pix of (0°, +90°).
        var pole = Point(data.Ref.GetProperty("views").GetProperty("pole").GetProperty("poleAt"));
        Assert.True(box.Contains(pole.X, pole.Y));
        var raStep = grid.GetProperty("raStep").GetDouble();
        var meridians = grid.GetProperty("lines").EnumerateArray().Where(l => l.GetProperty("axis").GetString() == "ra").ToList();
        // Every meridian passes through the pole, so all 360° / step of them cross the view.
        Assert.Equal((int)Math.Round(360 / raStep), meridians.Count);
        foreach (var meridian in meridians)
        {
            var nearest = meridian.GetProperty("segments").EnumerateArray().SelectMany(s => s.EnumerateArray()).Select(Point)
                .Min(p => box.ScreenDistance(p, pole));
            Assert.True(nearest < 1, $"meridian {meridian.GetProperty("label").GetString()} comes only {nearest:0.##} screen px from the pole");
        }
        var parallels = grid.GetProperty("lines").EnumerateArray().Where(l => l.GetProperty("axis").GetString() == "dec").ToList();
        Assert.NotEmpty(parallels);
        Assert.All(parallels, p => Assert.True(p.GetProperty("value").GetDouble() > 89.5));
    }

    [Theory]
    [InlineData("y0=1&x1=100&y1=100&width=500&height=500", "x0")]
    [InlineData("x0=1&y0=1&x1=1&y1=100&width=500&height=500", "x1")]
    [InlineData("x0=1&y0=100&x1=100&y1=50&width=500&height=500", "y1")]
    [InlineData("x0=NaN&y0=1&x1=100&y1=100&width=500&height=500", "x0")]
    [InlineData("x0=1&y0=1&x1=Infinity&y1=100&width=500&height=500", "x1")]
    [InlineData("x0=1&y0=1&x1=100&y1=100&width=0&height=500", "width")]
    [InlineData("x0=1&y0=1&x1=100&y1=100&width=500&height=10001", "height")]
    [InlineData("x0=1&y0=1&x1=100&y1=100&width=500&height=abc", "height")]
    [InlineData("x0=1&y0=1&x1=1e9&y1=100&width=500&height=500", "x1")]
    [InlineData("x0=-1e9&y0=1&x1=100&y1=100&width=500&height=500", "x0")]
    public async Task Bad_boxes_and_screens_are_400_naming_the_parameter(string query, string parameter)
    {
        await SkyAssert.Problem(data.Client, $"/api/fields/tan/sky?{query}", HttpStatusCode.BadRequest, parameter);
    }

    [Theory]
    [InlineData("plain", "no celestial WCS")]
    [InlineData("odd", "XPH")]
    public async Task Without_a_usable_WCS_sky_is_a_422_saying_why(string field, string why)
    {
        var problem = await SkyAssert.Problem(data.Client, $"/api/fields/{field}/sky?x0=1&y0=1&x1=100&y1=100&width=500&height=500",
            HttpStatusCode.UnprocessableEntity, "hdu");
        Assert.Contains(why, problem.GetProperty("detail").GetString());
        Assert.Contains(why, problem.GetProperty("skyError").GetString());
    }

    [Fact]
    public async Task The_OpenAPI_document_describes_the_sky_endpoint_and_the_probe_by_position()
    {
        var doc = await SkyAssert.Get(data.Client, "/openapi/v1.json");
        var paths = doc.GetProperty("paths");
        Assert.True(paths.TryGetProperty("/api/fields/{field}/sky", out var sky));
        var skyParameters = sky.GetProperty("get").GetProperty("parameters").EnumerateArray().Select(p => p.GetProperty("name").GetString()!).ToList();
        Assert.Equal(["band", "field", "hdu", "height", "width", "x0", "x1", "y0", "y1"], skyParameters.Order().ToArray());
        var probeParameters = paths.GetProperty("/api/fields/{field}/probe").GetProperty("get").GetProperty("parameters").EnumerateArray()
            .Select(p => p.GetProperty("name").GetString()).ToList();
        Assert.Contains("position", probeParameters);
        Assert.Contains("ra", probeParameters);
        Assert.Contains("dec", probeParameters);
    }
}
