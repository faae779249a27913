using System.Globalization;
using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests;

/// <summary>
/// The probe's sky coordinates and sky-position lookups against astropy.wcs (wcslib) all_pix2world /
/// all_world2pix and astropy.coordinates SkyCoord (ICRS, Galactic), from Debian's python3-astropy.
/// </summary>
public sealed class SkyProbeTests(SkyDataFixture data) : IClassFixture<SkyDataFixture>
{
    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    [Theory]
    [InlineData("tan")]
    [InlineData("sip")]
    [InlineData("galactic")]
    [InlineData("pole")]
    [InlineData("fk5")]
    public async Task Probe_by_pixel_gives_ICRS_and_Galactic_positions_within_a_milliarcsecond_of_astropy(string field)
    {
        foreach (var point in data.Ref.GetProperty("probes").GetProperty(field).EnumerateArray())
        {
            double x = point.GetProperty("x").GetDouble(), y = point.GetProperty("y").GetDouble();
            var probe = await SkyAssert.Get(data.Client, $"/api/fields/{field}/probe?x={Num(x)}&y={Num(y)}");
            Assert.Equal(x, probe.GetProperty("atX").GetDouble());
            Assert.Equal(y, probe.GetProperty("atY").GetDouble());
            Assert.Equal((int)Math.Floor(x + 0.5), probe.GetProperty("x").GetInt32());
            // Reference: astropy.wcs all_pix2world (origin 1), then SkyCoord(...).icrs (for FK5 J1975: IAU 1976
            // precession and the frame bias) and .galactic (IAU 1958 via FK5).
            SkyAssert.SamePosition(point.GetProperty("ra").GetDouble(), point.GetProperty("dec").GetDouble(),
                probe.GetProperty("ra").GetDouble(), probe.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, $"{field} ({x}, {y}) RA/Dec");
            SkyAssert.SamePosition(point.GetProperty("l").GetDouble(), point.GetProperty("b").GetDouble(),
                probe.GetProperty("l").GetDouble(), probe.GetProperty("b").GetDouble(), SkyAssert.Milliarcsecond, $"{field} ({x}, {y}) l/b");
            // Reference: astropy Angle.to_string (sep ':', 3 decimals of RA seconds, 2 of Dec seconds, signed Dec).
            Assert.Equal(point.GetProperty("raText").GetString(), probe.GetProperty("raSexagesimal").GetString());
            Assert.Equal(point.GetProperty("decText").GetString(), probe.GetProperty("decSexagesimal").GetString());
        }
    }

    [Theory]
    [InlineData("tan")]
    [InlineData("sip")]
    public async Task Probe_by_ra_dec_and_by_typed_text_lands_where_astropy_all_world2pix_puts_the_position(string field)
    {
        var r = data.Ref.GetProperty("skyProbes").GetProperty(field);
        double ra = r.GetProperty("ra").GetDouble(), dec = r.GetProperty("dec").GetDouble();
        var probe = await SkyAssert.Get(data.Client, $"/api/fields/{field}/probe?ra={Num(ra)}&dec={Num(dec)}");
        // Reference: astropy.wcs all_world2pix (origin 1, tolerance 1e-12; iterative for SIP).
        Assert.Equal(r.GetProperty("x").GetDouble(), probe.GetProperty("atX").GetDouble(), 1e-6);
        Assert.Equal(r.GetProperty("y").GetDouble(), probe.GetProperty("atY").GetDouble(), 1e-6);
        Assert.Equal((int)Math.Floor(r.GetProperty("x").GetDouble() + 0.5), probe.GetProperty("x").GetInt32());
        Assert.Equal((int)Math.Floor(r.GetProperty("y").GetDouble() + 0.5), probe.GetProperty("y").GetInt32());
        Assert.Equal(0, probe.GetProperty("hdu").GetInt32());
        SkyAssert.SamePosition(ra, dec, probe.GetProperty("ra").GetDouble(), probe.GetProperty("dec").GetDouble(), SkyAssert.Milliarcsecond, "round trip");

        // The same position typed as astropy writes it ("hh:mm:ss.ssss +dd:mm:ss.ssss"), parsed back by astropy for the pixel.
        var text = r.GetProperty("text").GetString()!;
        var typed = await SkyAssert.Get(data.Client, $"/api/fields/{field}/probe?position={Uri.EscapeDataString(text)}");
        Assert.Equal(r.GetProperty("textX").GetDouble(), typed.GetProperty("atX").GetDouble(), 1e-6);
        Assert.Equal(r.GetProperty("textY").GetDouble(), typed.GetProperty("atY").GetDouble(), 1e-6);

        // And with unit letters, as astropy's default hmsdms form writes it ("10h00m43.623s -02d29m27.650s").
        var hms = await SkyAssert.Get(data.Client, $"/api/fields/{field}/probe?position={Uri.EscapeDataString(r.GetProperty("hms").GetString()!)}");
        Assert.Equal(r.GetProperty("hmsX").GetDouble(), hms.GetProperty("atX").GetDouble(), 1e-6);
        Assert.Equal(r.GetProperty("hmsY").GetDouble(), hms.GetProperty("atY").GetDouble(), 1e-6);
    }

    [Theory]
    [InlineData("CHIP1")]
    [InlineData("CHIP2")]
    [InlineData("CHIP3")]
    [InlineData("CHIP4")]
    public async Task A_sky_position_finds_its_chip_of_a_multi_HDU_frame(string chip)
    {
        var r = data.Ref.GetProperty("camera").GetProperty(chip);
        var hdu = r.GetProperty("hdu").GetInt32();
        // Typed with spaces ("hh mm ss.ssss +dd mm ss.ssss"), no hdu: the server finds the chip.
        var typed = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?position={Uri.EscapeDataString(r.GetProperty("text").GetString()!)}");
        Assert.Equal(hdu, typed.GetProperty("hdu").GetInt32());
        Assert.Equal(chip, typed.GetProperty("hduName").GetString());
        // Reference: astropy all_world2pix with that chip's own WCS (each chip has its own CRVAL).
        Assert.Equal(r.GetProperty("textX").GetDouble(), typed.GetProperty("atX").GetDouble(), 1e-6);
        Assert.Equal(r.GetProperty("textY").GetDouble(), typed.GetProperty("atY").GetDouble(), 1e-6);

        double ra = r.GetProperty("ra").GetDouble(), dec = r.GetProperty("dec").GetDouble();
        var byRaDec = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?ra={Num(ra)}&dec={Num(dec)}");
        Assert.Equal(hdu, byRaDec.GetProperty("hdu").GetInt32());
        Assert.Equal(r.GetProperty("x").GetDouble(), byRaDec.GetProperty("atX").GetDouble(), 1e-6);
        Assert.Equal(r.GetProperty("y").GetDouble(), byRaDec.GetProperty("atY").GetDouble(), 1e-6);

        // Naming the right chip gives the same answer; naming another one is a 404 that points to the right one.
        var named = await SkyAssert.Get(data.Client, $"/api/fields/camera/probe?ra={Num(ra)}&dec={Num(dec)}&hdu={chip}");
        Assert.Equal(byRaDec.GetProperty("atX").GetDouble(), named.GetProperty("atX").GetDouble());
        var other = hdu == 1 ? "CHIP2" : "CHIP1";
        var problem = await SkyAssert.Problem(data.Client, $"/api/fields/camera/probe?ra={Num(ra)}&dec={Num(dec)}&hdu={other}", HttpStatusCode.NotFound, "ra");
        Assert.Contains(other, problem.GetProperty("detail").GetString());
        Assert.Contains($"It is on {chip}", problem.GetProperty("detail").GetString());
    }

    [Fact]
    public async Task A_position_in_a_chip_gap_or_off_the_field_is_a_404_that_says_which()
    {
        // Both positions lie on no chip by astropy all_world2pix (asserted in sky_fixture.py); the gap one lies
        // between the chips, the other 15′ west of the frame.
        var gap = data.Ref.GetProperty("camera").GetProperty("gap");
        var inGap = await SkyAssert.Problem(data.Client,
            $"/api/fields/camera/probe?ra={Num(gap.GetProperty("ra").GetDouble())}&dec={Num(gap.GetProperty("dec").GetDouble())}", HttpStatusCode.NotFound, "ra");
        Assert.Contains("gap between the chips", inGap.GetProperty("detail").GetString());

        var off = data.Ref.GetProperty("camera").GetProperty("off");
        var text = $"{Num(off.GetProperty("ra").GetDouble())} {Num(off.GetProperty("dec").GetDouble())}";
        var offField = await SkyAssert.Problem(data.Client, $"/api/fields/camera/probe?position={Uri.EscapeDataString(text)}", HttpStatusCode.NotFound, "position");
        Assert.Contains("off the field", offField.GetProperty("detail").GetString());

        // A single image: a position beside it is off the image, and one on the far side of the sky too.
        var beside = await SkyAssert.Problem(data.Client, "/api/fields/tan/probe?ra=150.1&dec=-1.0", HttpStatusCode.NotFound, "ra");
        Assert.Contains("off the image", beside.GetProperty("detail").GetString());
        var antipode = await SkyAssert.Problem(data.Client, "/api/fields/tan/probe?ra=330.1&dec=2.3", HttpStatusCode.NotFound, "ra");
        Assert.Contains("off the image", antipode.GetProperty("detail").GetString());
    }

    [Theory]
    [InlineData("position=12:34:xx", "position")]
    [InlineData("position=hello", "position")]
    [InlineData("position=12:34:56.7", "position")]                    // only one coordinate
    [InlineData("position=25:00:00%20%2B10:00:00", "position")]        // RA hours must be below 24
    [InlineData("position=10:00:00%20%2B95:00:00", "position")]        // |Dec| must not exceed 90°
    [InlineData("position=10:61:00%20%2B10:00:00", "position")]        // minutes below 60
    [InlineData("ra=10&dec=95", "dec")]
    [InlineData("ra=10&dec=-90.5", "dec")]
    [InlineData("ra=-1&dec=10", "ra")]
    [InlineData("ra=361&dec=10", "ra")]
    [InlineData("ra=abc&dec=10", "ra")]
    [InlineData("ra=10", "dec")]
    [InlineData("dec=10", "ra")]
    [InlineData("x=10&y=10&ra=150.1&dec=-2.3", "ra")]
    [InlineData("x=10&position=10:00:24%20-02:18:00", "position")]
    [InlineData("ra=150.1&dec=-2.3&position=10:00:24%20-02:18:00", "position")]
    public async Task Malformed_out_of_range_or_mixed_positions_are_400_naming_the_parameter(string query, string parameter)
    {
        // Ranges: common practice (RA 0..24 h or 0..360°, Dec -90..+90°, sexagesimal minutes and seconds below 60).
        await SkyAssert.Problem(data.Client, $"/api/fields/tan/probe?{query}", HttpStatusCode.BadRequest, parameter);
    }

    [Fact]
    public async Task An_HDU_without_WCS_is_served_for_pixels_with_sky_null_and_says_why()
    {
        var plain = await SkyAssert.Get(data.Client, "/api/fields/plain");
        var hdu = plain.GetProperty("hdus")[0];
        Assert.Equal(JsonValueKind.Null, hdu.GetProperty("sky").ValueKind);
        Assert.Contains("no celestial WCS", hdu.GetProperty("skyError").GetString());

        var probe = await SkyAssert.Get(data.Client, "/api/fields/plain/probe?x=10&y=20");
        Assert.Equal(10, probe.GetProperty("x").GetInt32());
        Assert.Equal(JsonValueKind.Number, probe.GetProperty("value").ValueKind);
        foreach (var name in new[] { "ra", "dec", "raSexagesimal", "decSexagesimal", "l", "b" })
            Assert.Equal(JsonValueKind.Null, probe.GetProperty(name).ValueKind);

        var problem = await SkyAssert.Problem(data.Client, "/api/fields/plain/probe?ra=10&dec=10", HttpStatusCode.UnprocessableEntity, null);
        Assert.Contains("no celestial WCS", problem.GetProperty("skyError").GetString());
        await SkyAssert.Problem(data.Client, "/api/fields/plain/probe?ra=10&dec=10&hdu=0", HttpStatusCode.UnprocessableEntity, "hdu");
    }

    [Fact]
    public async Task An_unsupported_reference_system_is_named_in_skyError()
    {
        // FITS WCS Paper I section 3.1: RADESYS = 'FK4' with EQUINOX 1950 is the FK4 system, which we do not convert.
        var fk4 = await SkyAssert.Get(data.Client, "/api/fields/fk4");
        var hdu = fk4.GetProperty("hdus")[0];
        Assert.Equal(JsonValueKind.Null, hdu.GetProperty("sky").ValueKind);
        Assert.Contains("FK4", hdu.GetProperty("skyError").GetString());
    }

    [Fact]
    public async Task An_unsupported_projection_is_named_in_skyError()
    {
        var odd = await SkyAssert.Get(data.Client, "/api/fields/odd");
        var hdu = odd.GetProperty("hdus")[0];
        Assert.Equal(JsonValueKind.Null, hdu.GetProperty("sky").ValueKind);
        var error = hdu.GetProperty("skyError").GetString()!;
        Assert.Contains("XPH", error);
        Assert.Contains("not supported", error);
        var probe = await SkyAssert.Get(data.Client, "/api/fields/odd/probe?x=1&y=1");
        Assert.Equal(JsonValueKind.Null, probe.GetProperty("ra").ValueKind);
    }

    [Theory]
    [InlineData("tan", "TAN", null, "ICRS")]
    [InlineData("sip", "TAN", "SIP", "ICRS")]
    [InlineData("galactic", "TAN", null, "Galactic")]
    [InlineData("pole", "TAN", null, "ICRS")]
    [InlineData("fk5", "TAN", null, "FK5 J1975.0")]
    public async Task Fields_list_each_HDUs_projection_distortion_frame_and_pixel_scale(string field, string projection, string? distortion, string frame)
    {
        var doc = await SkyAssert.Get(data.Client, $"/api/fields/{field}");
        var sky = doc.GetProperty("hdus")[0].GetProperty("sky");
        Assert.Equal(JsonValueKind.Null, doc.GetProperty("hdus")[0].GetProperty("skyError").ValueKind);
        Assert.Equal(projection, sky.GetProperty("projection").GetString());
        Assert.Equal(distortion, sky.GetProperty("distortion").GetString());
        Assert.Equal(frame, sky.GetProperty("frame").GetString());
        var scale = data.Ref.GetProperty("scales").GetProperty(field);
        var served = sky.GetProperty("pixelScale").GetDouble();
        // Reference: sqrt(|det J|) at the image centre from central differences of astropy all_pix2world.
        Assert.Equal(scale.GetProperty("centre").GetProperty("scale").GetDouble(), served, 1e-6 * served);
        if (distortion is null)
        {
            // Without distortion and a square pixel, astropy.wcs.utils.proj_plane_pixel_scales gives the same scale on
            // both axes; a TAN field of a few arcminutes differs from it by far less than 1e-6 at its centre.
            foreach (var s in scale.GetProperty("planeScales").EnumerateArray())
                Assert.Equal(s.GetDouble(), served, 1e-6 * served);
        }
    }
}
