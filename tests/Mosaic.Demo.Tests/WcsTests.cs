using System.Text.Json.Nodes;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Tests.Support;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Tests;

/// <summary>The chip headers' TAN-SIP WCS, read and applied by astropy.wcs (Debian python3-astropy), against the scene.</summary>
[Collection(SmallFieldCollection.Name)]
public sealed class WcsTests(SmallField field)
{
    [Fact]
    public void Astropy_puts_drawn_stars_at_their_catalogue_positions_within_10_milliarcsec()
    {
        var green = field.Scene.Options.Bands.ToList().FindIndex(b => b.Name == "green");
        var checkedStars = 0;
        var operations = new List<object>();
        var expected = new List<List<CatalogueStar>>();
        foreach (var chip in field.Scene.Chips)
        {
            // Bright enough to matter, far from full well so the pixel is really there; several per chip.
            var stars = field.Scene.Stars
                .Where(s => !s.Placed && s.FluxElectrons[green] > 1_000 && s.FluxElectrons[green] < 300_000)
                .Where(s => chip.Contains(chip.Wcs.SkyToPixel(s.Position), margin: 3))
                .Take(8)
                .ToList();
            var pixels = stars.Select(s => chip.Wcs.SkyToPixel(s.Position)).Select(p => new[] { p.X, p.Y }).ToArray();
            foreach (var band in new[] { "green", "red" })
            {
                operations.Add(new { op = "pix2world", file = field.FileOf(band), ext = chip.ExtName, pixels });
                expected.Add(stars);
            }
        }

        var results = AstropyProbe.Run(operations.ToArray());
        for (var i = 0; i < results.Count; i++)
        {
            var world = results[i]!["world"]!.AsArray();
            for (var k = 0; k < expected[i].Count; k++)
            {
                var star = expected[i][k];
                var separation = Sky.DistanceArcsec(star.Position, world[k]![0]!.GetValue<double>(), world[k]![1]!.GetValue<double>());
                // Requirement of the product issue: 0.01 arcsec (0.04 pixel).
                Assert.True(separation < 0.01, $"star {star.Id} on {operations[i]}: astropy puts it {separation:F4} arcsec away");
                checkedStars++;
            }
        }
        Assert.True(checkedStars >= 30, $"only {checkedStars} star positions were checked");
    }

    [Fact]
    public void Inverse_SIP_and_all_world2pix_round_trip_chip_corners_within_a_hundredth_of_a_pixel()
    {
        var operations = new List<object>();
        var pixelsPerChip = new List<double[][]>();
        foreach (var chip in field.Scene.Chips)
        {
            double w = chip.Width - 1, h = chip.Height - 1;
            var pixels = new[] { new[] { 0.0, 0.0 }, new[] { w, 0.0 }, new[] { 0.0, h }, new[] { w, h }, new[] { w / 2, h / 2 } };
            pixelsPerChip.Add(pixels);
            operations.Add(new { op = "sip_inverse", file = field.FileOf("red"), ext = chip.ExtName, pixels });
            operations.Add(new { op = "pix2world", file = field.FileOf("red"), ext = chip.ExtName, pixels });
        }
        var first = AstropyProbe.Run(operations.ToArray());

        var back = new List<object>();
        for (var c = 0; c < field.Scene.Chips.Count; c++)
        {
            var inverse = first[2 * c]!["pixels"]!.AsArray();
            for (var k = 0; k < pixelsPerChip[c].Length; k++)
            {
                // AP/BP alone (astropy sip_foc2pix): the fitted inverse polynomial, no iteration.
                var error = Distance(inverse[k]!, pixelsPerChip[c][k]);
                Assert.True(error < 0.01, $"{field.Scene.Chips[c].ExtName} AP/BP at {string.Join(",", pixelsPerChip[c][k])}: off by {error:F5} px");
            }
            var world = first[2 * c + 1]!["world"]!.AsArray().Select(p => new[] { p![0]!.GetValue<double>(), p[1]!.GetValue<double>() }).ToArray();
            back.Add(new { op = "world2pix", file = field.FileOf("red"), ext = field.Scene.Chips[c].ExtName, world });
        }
        var second = AstropyProbe.Run(back.ToArray());
        for (var c = 0; c < field.Scene.Chips.Count; c++)
        {
            var pixels = second[c]!["pixels"]!.AsArray();
            for (var k = 0; k < pixelsPerChip[c].Length; k++)
                Assert.True(Distance(pixels[k]!, pixelsPerChip[c][k]) < 0.01, $"{field.Scene.Chips[c].ExtName}: all_world2pix round trip off");
        }
    }

    [Fact]
    public void Chip_headers_have_a_quarter_arcsecond_scale_east_left_north_up_and_a_few_pixels_of_distortion_at_the_corners()
    {
        var chips = field.Scene.Chips;
        var keys = new[] { "CTYPE1", "CTYPE2", "RADESYS", "EQUINOX", "CRPIX1", "CRPIX2", "CD1_1", "CD1_2", "CD2_1", "CD2_2", "CRVAL1", "CRVAL2", "A_ORDER", "B_ORDER", "AP_ORDER", "BP_ORDER" };
        var operations = new List<object>();
        foreach (var chip in chips) operations.Add(new { op = "header", file = field.FileOf("blue"), ext = chip.ExtName, keys });
        // The outer corner of the first chip is a field corner; the linear WCS alone shows the distortion there.
        operations.Add(new { op = "pix2world", file = field.FileOf("blue"), ext = chips[0].ExtName, pixels = new[] { new[] { -0.5, -0.5 } } });
        var results = AstropyProbe.Run(operations.ToArray());

        foreach (var (chip, header) in chips.Zip(results.Take(chips.Count)))
        {
            Assert.Equal("RA---TAN-SIP", (string?)header!["CTYPE1"]);
            Assert.Equal("DEC--TAN-SIP", (string?)header["CTYPE2"]);
            Assert.Equal("ICRS", (string?)header["RADESYS"]);
            Assert.Equal(2000.0, (double)header["EQUINOX"]!);
            Assert.Equal(3, (int)header["A_ORDER"]!);
            Assert.Equal(3, (int)header["B_ORDER"]!);
            Assert.InRange((int)header["AP_ORDER"]!, 3, 4);
            Assert.InRange((int)header["BP_ORDER"]!, 3, 4);
            double cd11 = (double)header["CD1_1"]!, cd12 = (double)header["CD1_2"]!, cd21 = (double)header["CD2_1"]!, cd22 = (double)header["CD2_2"]!;
            Assert.True(cd11 < 0 && cd22 > 0, $"{chip.ExtName}: east must be left (CD1_1 < 0) and north up (CD2_2 > 0)");
            var scale = Math.Sqrt(Math.Abs(cd11 * cd22 - cd12 * cd21)) * 3600;
            // Product requirement: about 0.25 arcsec per pixel, rotation under 0.1 degree.
            Assert.InRange(scale, 0.2475, 0.2525);
            // Rotation of a CD matrix with CDELT1 < 0 < CDELT2: CD2_1 = s sin ρ, CD2_2 = s cos ρ (WCS Paper II; from memory).
            var rotation = Math.Atan2(cd21, cd22) * 180 / Math.PI;
            Assert.True(Math.Abs(rotation) < 0.1, $"{chip.ExtName}: rotation {rotation} deg");
            Assert.Equal(field.Scene.FieldCentre.RaDegrees, (double)header["CRVAL1"]!, 9);
            Assert.Equal(field.Scene.FieldCentre.DecDegrees, (double)header["CRVAL2"]!, 9);
        }

        // Product requirement, "a few pixels at the field corners": astropy's full WCS against the header's linear part.
        var corner = results[chips.Count]!["world"]![0]!;
        var linear = LinearPixelOf(results[0]!, corner[0]!.GetValue<double>(), corner[1]!.GetValue<double>());
        var shift = Math.Sqrt(Math.Pow(linear.X + 0.5, 2) + Math.Pow(linear.Y + 0.5, 2));
        Assert.InRange(shift, 1.0, 10.0);
    }

    /// <summary>The pixel a linear TAN WCS (no SIP) gives for a sky position: gnomonic plane then CD⁻¹ (WCS Papers I and II).</summary>
    private static PixelPosition LinearPixelOf(JsonNode header, double ra, double dec)
    {
        double Get(string key) => (double)header[key]!;
        var (xi, eta) = Sky.Tangent(new SkyCoordinate(Get("CRVAL1"), Get("CRVAL2")), ra, dec);
        double cd11 = Get("CD1_1"), cd12 = Get("CD1_2"), cd21 = Get("CD2_1"), cd22 = Get("CD2_2");
        var det = cd11 * cd22 - cd12 * cd21;
        var u = (cd22 * xi - cd12 * eta) / det;
        var v = (-cd21 * xi + cd11 * eta) / det;
        return new PixelPosition(u + Get("CRPIX1") - 1, v + Get("CRPIX2") - 1);
    }

    private static double Distance(JsonNode point, double[] expected) =>
        Math.Sqrt(Math.Pow(point[0]!.GetValue<double>() - expected[0], 2) + Math.Pow(point[1]!.GetValue<double>() - expected[1], 2));
}
