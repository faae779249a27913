using Mosaic.Fits;
using Mosaic.Server.Composite;

namespace Mosaic.Server.Tests.Composite;

/// <summary>The linear part of a celestial WCS as FITS WCS Paper I (Greisen and Calabretta 2002) defines it, compared within 1e-9.</summary>
public sealed class LinearWcsTests
{
    private static Header Header(params (string Keyword, object Value)[] cards) =>
        new([new HeaderCard("CTYPE1", "RA---TAN", null), new HeaderCard("CTYPE2", "DEC--TAN", null), .. cards.Select(c => new HeaderCard(c.Keyword, c.Value, null))]);

    [Fact]
    public void PC_times_CDELT_is_the_same_matrix_as_CD()
    {
        // Paper I eq. 1 and 3: CD_ij = CDELT_i × PC_ij, so these two headers describe one grid.
        var cd = LinearWcs.From(Header(("CRPIX1", 100.5), ("CRPIX2", 80.0), ("CRVAL1", 30.0), ("CRVAL2", -5.0),
            ("CD1_1", -2.0e-4), ("CD1_2", 1.0e-5), ("CD2_1", 3.0e-5), ("CD2_2", 2.0e-4)))!;
        var pc = LinearWcs.From(Header(("CRPIX1", 100.5), ("CRPIX2", 80.0), ("CRVAL1", 30.0), ("CRVAL2", -5.0),
            ("CDELT1", -2.0e-4), ("CDELT2", 2.0e-4), ("PC1_1", 1.0), ("PC1_2", -0.05), ("PC2_1", 0.15), ("PC2_2", 1.0)))!;
        Assert.Null(cd.DifferenceFrom(pc, PixelGrid.Tolerance));
        // Paper I defaults: PC the identity, CDELT 1.
        var bare = LinearWcs.From(Header(("CRPIX1", 1.0)))!;
        Assert.Equal((1.0, 0.0, 0.0, 1.0), (bare.M11, bare.M12, bare.M21, bare.M22));
    }

    [Fact]
    public void Differences_past_one_part_in_a_billion_count_and_smaller_ones_do_not()
    {
        var a = LinearWcs.From(Header(("CRPIX1", 1000.0), ("CRPIX2", 1000.0), ("CRVAL1", 150.0), ("CRVAL2", 2.0), ("CD1_1", -7.3e-5), ("CD2_2", 7.3e-5)))!;
        var near = a with { Crpix1 = 1000.0 * (1 + 5e-10), M11 = -7.3e-5 * (1 + 5e-10), M12 = 1e-20 };
        var far = a with { Crpix1 = 1000.0 * (1 + 5e-9) };
        var rotated = a with { M12 = 7.3e-5 * 1e-6 };
        Assert.Null(a.DifferenceFrom(near, PixelGrid.Tolerance));
        Assert.Contains("CRPIX", a.DifferenceFrom(far, PixelGrid.Tolerance));
        Assert.Contains("CD matrix", a.DifferenceFrom(rotated, PixelGrid.Tolerance));
        Assert.Null(LinearWcs.From(new Header([new HeaderCard("NAXIS", 2L, null)])));
    }
}
