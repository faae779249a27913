using Mosaic.Wcs.Header;
using Mosaic.Wcs.Linear;

namespace Mosaic.Wcs.Tests.Linear;

public sealed class LinearTransformTests
{
    [Fact]
    public void ReferencePixelMapsToOriginAndMatrixApplies()
    {
        // Paper I eq. 1: x_i = sum_j CD_ij (p_j - r_j); one pixel along axis 1 moves by column 1 of CD.
        var h = WcsHeader.From(Cards.ToHeader(Cards.Celestial("TAN", 10, 20)));
        var t = new LinearTransform(h);
        Assert.Equal((0.0, 0.0), t.PixelToIntermediate(h.CrPix1, h.CrPix2));
        var (x, y) = t.PixelToIntermediate(h.CrPix1 + 1, h.CrPix2);
        Assert.Equal(h.Cd11, x, 15);
        Assert.Equal(h.Cd21, y, 15);
        var (p1, p2) = t.IntermediateToPixel(0.3, -0.2);
        var (bx, by) = t.PixelToIntermediate(p1, p2);
        Assert.Equal(0.3, bx, 12);
        Assert.Equal(-0.2, by, 12);
    }
}
