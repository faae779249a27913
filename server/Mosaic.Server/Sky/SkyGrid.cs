using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Sky;

/// <summary>
/// An RA/Dec (ICRS) coordinate grid for a view: nice steps giving about five lines each way, every line traced on
/// the image to within half a screen pixel and cut where it leaves the projection's domain or the view plus a
/// margin. Steps are in degrees; null when no point of the view has a sky position.
/// </summary>
public sealed record SkyGrid(double? RaStep, double? DecStep, IReadOnlyList<GridLine> Lines)
{
    /// <summary>How far past the view lines are kept, as a fraction of its size, so panning shows no bare edge at once.</summary>
    public const double MarginFraction = 0.05;

    /// <summary>Labels sit this many screen pixels inside the view's edge (less in a very small view).</summary>
    public const double LabelInset = 12;

    private const int MaxLinesPerAxis = 64;

    public static SkyGrid Compute(Mosaic.Wcs.Wcs wcs, ViewBox box)
    {
        ArgumentNullException.ThrowIfNull(wcs);
        ArgumentNullException.ThrowIfNull(box);
        var range = SkyRange.Measure(wcs, box);
        if (range is null) return new SkyGrid(null, null, []);

        var raStep = GridSpacing.ChooseRaStep(range.RaSpan);
        var decStep = GridSpacing.ChooseDecStep(range.DecSpan);
        var region = box.Grown(MarginFraction * Math.Max(box.Width, box.Height));
        var inset = box.Grown(-Math.Min(LabelInset, 0.1 * Math.Min(box.Width, box.Height)));
        var lines = new List<GridLine>();
        // A meridian lying wholly inside the view is labelled where it crosses the centre's parallel, not where
        // all of them meet at a pole.
        double? centreDec = wcs.TryPixelToIcrs(box.Centre.X, box.Centre.Y, out var centre) ? centre.Declination : null;

        // Meridians run over the Dec range of the view, padded so the margin is covered too.
        var decPad = Math.Max(0.25 * range.DecSpan, 1e-9);
        double decLo = Math.Max(-90, range.DecMin - decPad), decHi = Math.Min(90, range.DecMax + decPad);
        var (raFirst, raLast) = range.FullCircle
            ? (0L, GridSpacing.RaUnitsPerCircle / raStep - 1)
            : ((long)Math.Ceiling(range.RaStart * GridSpacing.RaUnitsPerDegree / raStep), (long)Math.Floor(range.RaEnd * GridSpacing.RaUnitsPerDegree / raStep));
        for (var k = raFirst; k <= raLast && k - raFirst < MaxLinesPerAxis; k++)
        {
            var units = Modulo(k * raStep, GridSpacing.RaUnitsPerCircle);
            var ra = (double)units / GridSpacing.RaUnitsPerDegree;
            var tracer = new LineTracer(Meridian(wcs, ra), region);
            var line = Finish(GridAxis.Ra, ra, GridLabels.RightAscension(units, raStep), tracer, tracer.Trace(decLo, decHi), box, inset, closed: false, centreDec);
            if (line is not null) lines.Add(line);
        }

        // Parallels run over the RA range, padded; a range that would wrap onto itself becomes the whole circle.
        var raPad = 0.25 * range.RaSpan;
        var wholeCircle = range.FullCircle || range.RaSpan + 2 * raPad >= 360;
        double raLo = wholeCircle ? 0 : range.RaStart - raPad, raHi = wholeCircle ? 360 : range.RaEnd + raPad;
        var decFirst = (long)Math.Ceiling(range.DecMin * GridSpacing.DecUnitsPerDegree / decStep);
        var decLast = (long)Math.Floor(range.DecMax * GridSpacing.DecUnitsPerDegree / decStep);
        for (var k = decFirst; k <= decLast && k - decFirst < MaxLinesPerAxis; k++)
        {
            var units = k * decStep;
            // A parallel at a pole is a point.
            if (Math.Abs(units) >= 90 * GridSpacing.DecUnitsPerDegree) continue;
            var dec = (double)units / GridSpacing.DecUnitsPerDegree;
            var tracer = new LineTracer(Parallel(wcs, dec), region);
            var line = Finish(GridAxis.Dec, dec, GridLabels.Declination(units, decStep), tracer, tracer.Trace(raLo, raHi), box, inset, closed: wholeCircle, null);
            if (line is not null) lines.Add(line);
        }

        return new SkyGrid((double)raStep / GridSpacing.RaUnitsPerDegree, (double)decStep / GridSpacing.DecUnitsPerDegree, lines);
    }

    private static SkyCurve Meridian(Mosaic.Wcs.Wcs wcs, double ra) => (double dec, out double x, out double y) =>
        wcs.TryIcrsToPixel(new SkyPosition(ra, Math.Clamp(dec, -90, 90)), out x, out y);

    private static SkyCurve Parallel(Mosaic.Wcs.Wcs wcs, double dec) => (double ra, out double x, out double y) =>
        wcs.TryIcrsToPixel(new SkyPosition(ra, dec), out x, out y);

    /// <summary>The line as served, or null when none of it falls inside the view itself.</summary>
    /// <param name="labelParameter">Where on the line to put a label that finds no edge: the parameter nearest this, else the lowest or leftmost point.</param>
    private static GridLine? Finish(GridAxis axis, double value, string label, LineTracer tracer, List<List<TracePoint>> segments,
        ViewBox box, ViewBox inset, bool closed, double? labelParameter)
    {
        if (closed && segments.Count >= 2)
        {
            // The circle was traced from RA 0 to 360: pieces meeting there are one piece.
            var first = segments[0];
            var last = segments[^1];
            if (first[0].T == 0 && last[^1].T == 360 && first[0].Pixel == last[^1].Pixel)
            {
                last.AddRange(first.Skip(1));
                segments.RemoveAt(0);
            }
        }
        if (!segments.Any(s => s.Any(p => box.Contains(p.X, p.Y)))) return null;

        // Prefer the bottom edge for meridians and the left edge for parallels (common practice on sky charts).
        Func<TracePoint, (double, double)> preference = axis == GridAxis.Ra ? p => (p.Y, p.X) : p => (p.X, p.Y);
        var crossings = segments.SelectMany(s => tracer.Crossings(s, inset)).ToList();
        var within = segments.SelectMany(s => s).Where(p => box.Contains(p.X, p.Y)).ToList();
        TracePoint? labelAt = crossings.Count > 0 ? crossings.MinBy(preference)
            : labelParameter is { } t ? within.MinBy(p => Math.Abs(p.T - t))
            : within.MinBy(preference);
        return new GridLine(axis, value, label, segments.Select(s => (IReadOnlyList<PixelPoint>)s.Select(p => p.Pixel).ToList()).ToList(), labelAt?.Pixel);
    }

    private static long Modulo(long value, long modulus)
    {
        var r = value % modulus;
        return r < 0 ? r + modulus : r;
    }
}
