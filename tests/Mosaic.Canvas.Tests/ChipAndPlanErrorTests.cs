using Mosaic.Canvas.Tests.Fields;
using Mosaic.Fits;
using Mosaic.Wcs.Header;

namespace Mosaic.Canvas.Tests;

/// <summary>Bad input gets typed errors: a chip without a celestial WCS cannot be a canvas chip, and chips no tangent plane can hold refuse a plan.</summary>
public sealed class ChipAndPlanErrorTests
{
    [Fact]
    public void A_chip_without_a_celestial_WCS_cannot_be_a_canvas_chip()
    {
        using var field = TestFields.AcrossRaZero();
        var plane = field.Chips[0].Plane;
        // FITS WCS Paper I: without CTYPEi there is no celestial axis; the caller learns it from Wcs.From and leaves the chip out.
        var bare = new Header([new HeaderCard("BITPIX", -32L, null), new HeaderCard("NAXIS", 2L, null)]);
        Assert.Throws<WcsHeaderException>(() => Wcs.Wcs.From(bare));
        Assert.Throws<ArgumentNullException>(() => new CanvasChip("CCD-X", 3, plane, null!));
        Assert.Throws<ArgumentNullException>(() => new ChipFootprint("CCD-X", 10, 10, null!));
        // The rest of the field is still placed without it.
        var band = new CanvasBand(CanvasPlan.Create([field.Chips[1].Footprint]), [field.Chips[1]]);
        Assert.Single(band.Chips);
    }

    [Fact]
    public void Chips_on_opposite_sides_of_the_sky_admit_no_tangent_plane_canvas()
    {
        var near = new ChipSpec("NEAR", 100, 100, 0, 0, 0);
        var far = near with { Name = "FAR" };
        ChipFootprint Footprint(ChipSpec s, double ra, double dec) =>
            new(s.Name, s.Width, s.Height, Wcs.Wcs.From(new Header(s.Cards(ra, dec).Select(c => new HeaderCard(c.Key, c.Value, null)).ToList())));
        // Centre near (100, 0): the outer chips lie about 90° from it, beyond any tangent plane.
        var beyond = Assert.Throws<CanvasPlanException>(() =>
            CanvasPlan.Create([Footprint(near, 10, 5), Footprint(far, 100, 0), Footprint(near with { Name = "OTHER" }, 190, -5)]));
        Assert.Contains("89°", beyond.Message);
        // About 55° each side of the centre: a tangent plane exists but would need millions of pixels a side.
        var huge = Assert.Throws<CanvasPlanException>(() => CanvasPlan.Create([Footprint(near, 10, 5), Footprint(far, 120, -20)]));
        Assert.Contains("at most", huge.Message);
        Assert.Throws<ArgumentException>(() => CanvasPlan.Create([]));
    }
}
