using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Sky;

/// <summary>
/// The RA and Dec a view covers, from sampling its edges densely and its interior coarsely. RA runs from
/// <see cref="RaStart"/> to <see cref="RaEnd"/> (RaEnd may pass 360, RaStart never below 0): the complement of the
/// largest gap between sampled RAs on the circle, so a view across RA = 0 gets one short range. With a celestial
/// pole in or near the view every RA is present and Dec runs to that pole.
/// </summary>
internal sealed record SkyRange(double RaStart, double RaEnd, double DecMin, double DecMax, bool FullCircle)
{
    private const int EdgeSamples = 200;
    private const int InteriorSamples = 24;

    // How far around the view (as a fraction of its size) a pole still counts as "near": meridians then fan out
    // over the whole circle as seen from the view.
    private const double PoleReach = 0.25;

    public double RaSpan => RaEnd - RaStart;

    public double DecSpan => DecMax - DecMin;

    /// <summary>Null where no point of the view has a sky position.</summary>
    public static SkyRange? Measure(Mosaic.Wcs.Wcs wcs, ViewBox box)
    {
        var ras = new List<double>();
        double decMin = double.PositiveInfinity, decMax = double.NegativeInfinity;
        void Sample(double x, double y)
        {
            if (!wcs.TryPixelToIcrs(x, y, out var p)) return;
            ras.Add(p.RightAscension);
            decMin = Math.Min(decMin, p.Declination);
            decMax = Math.Max(decMax, p.Declination);
        }

        double w = box.X1 - box.X0, h = box.Y1 - box.Y0;
        for (var i = 0; i <= EdgeSamples; i++)
        {
            var f = (double)i / EdgeSamples;
            Sample(box.X0 + f * w, box.Y0);
            Sample(box.X0 + f * w, box.Y1);
            Sample(box.X0, box.Y0 + f * h);
            Sample(box.X1, box.Y0 + f * h);
        }
        for (var i = 1; i < InteriorSamples; i++)
            for (var j = 1; j < InteriorSamples; j++)
                Sample(box.X0 + w * i / InteriorSamples, box.Y0 + h * j / InteriorSamples);
        if (ras.Count == 0) return null;

        var reach = new ViewBox(box.X0 - PoleReach * w, box.Y0 - PoleReach * h, box.X1 + PoleReach * w, box.Y1 + PoleReach * h, box.Width, box.Height);
        var north = PoleIn(wcs, 90, reach);
        var south = PoleIn(wcs, -90, reach);
        if (north) decMax = 90;
        if (south) decMin = -90;
        if (north || south) return new SkyRange(0, 360, decMin, decMax, true);

        ras.Sort();
        // The largest gap on the circle, the wrap from the last RA back to the first included.
        var gap = ras[0] + 360 - ras[^1];
        var start = ras[0];
        for (var k = 1; k < ras.Count; k++)
        {
            var g = ras[k] - ras[k - 1];
            if (g > gap) (gap, start) = (g, ras[k]);
        }
        return new SkyRange(start, start + 360 - gap, decMin, decMax, false);
    }

    private static bool PoleIn(Mosaic.Wcs.Wcs wcs, double declination, ViewBox reach) =>
        wcs.TryIcrsToPixel(new SkyPosition(0, declination), out var x, out var y) && reach.Contains(x, y)
        // A pole whose pixel does not lead back to it (a projection folding the far side) does not count.
        && wcs.TryPixelToIcrs(x, y, out var back) && Math.Abs(back.Declination - declination) < 1e-6;
}
