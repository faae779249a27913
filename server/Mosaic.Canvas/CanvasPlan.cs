using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Mosaic.Canvas.Geometry;
using Mosaic.Fits;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Canvas;

/// <summary>
/// The common sky canvas of a camera field: a TAN projection about the field centre (the normalised mean of the
/// unit vectors of every chip's centre), north up and east left (CD = diag(-s, s)) at the native pixel scale s (the
/// median of the chips' scales at their centres), just large enough to hold every chip's outline plus a margin of
/// one pixel. The plan is made from the chips of every band together, so all bands of a field share one grid.
/// The canvas is in the chips' own celestial frame when they all share one, else in ICRS.
/// </summary>
public sealed class CanvasPlan
{
    /// <summary>Largest canvas side in pixels; a field wider than this is refused rather than allocated.</summary>
    public const int MaxSide = 1 << 20;

    /// <summary>Chip edges are sampled this often (chip pixels) when sizing the canvas.</summary>
    private const int BoundsStep = 8;

    private CanvasPlan(int width, int height, IReadOnlyList<HeaderCard> cards, IReadOnlyList<ChipFootprint> footprints, double scale)
    {
        Width = width;
        Height = height;
        Cards = cards;
        Header = new Header(cards);
        Wcs = Mosaic.Wcs.Wcs.From(Header);
        Footprints = footprints;
        PixelScale = scale;
        Fingerprint = Hash(cards);
    }

    public int Width { get; }

    public int Height { get; }

    /// <summary>The canvas WCS: <c>Wcs.From(Header)</c>.</summary>
    public Wcs.Wcs Wcs { get; }

    /// <summary>A synthetic image header of the canvas (BITPIX -32, NAXIS1/2) with its WCS cards (WCSAXES, CTYPE, CUNIT, CRPIX, CRVAL, CD, RADESYS/EQUINOX).</summary>
    public Header Header { get; }

    /// <summary>The cards of <see cref="Header"/>, in order.</summary>
    public IReadOnlyList<HeaderCard> Cards { get; }

    /// <summary>The chips the plan was made from.</summary>
    public IReadOnlyList<ChipFootprint> Footprints { get; }

    /// <summary>Canvas pixel scale s in degrees per pixel.</summary>
    public double PixelScale { get; }

    /// <summary>Frame of the canvas sky axes.</summary>
    public CelestialFrame Frame => Wcs.Frame;

    /// <summary>16 hex digits of a SHA-256 of the canvas cards: equal plans, equal fingerprints.</summary>
    public string Fingerprint { get; }

    /// <exception cref="ArgumentException">No chips are given.</exception>
    /// <exception cref="CanvasPlanException">A chip has no sky position at its centre or edge, lies more than 90° from the field centre, or the canvas would exceed <see cref="MaxSide"/>.</exception>
    public static CanvasPlan Create(IReadOnlyList<ChipFootprint> chips)
    {
        ArgumentNullException.ThrowIfNull(chips);
        if (chips.Count == 0) throw new ArgumentException("a canvas needs at least one chip", nameof(chips));
        foreach (var chip in chips) ArgumentNullException.ThrowIfNull(chip, nameof(chips));

        var frame = chips.All(c => FrameLink.SameFrame(c.Wcs.Frame, chips[0].Wcs.Frame)) ? chips[0].Wcs.Frame : CelestialFrame.Icrs;

        double sx = 0, sy = 0, sz = 0;
        var scales = new double[chips.Count];
        for (var i = 0; i < chips.Count; i++)
        {
            var chip = chips[i];
            var (cx, cy) = ChipEdge.Centre(chip.Width, chip.Height);
            if (!chip.Wcs.TryPixelToSky(cx, cy, out var lon, out var lat))
                throw new CanvasPlanException($"chip {chip.Name}: its WCS gives no sky position at the chip centre ({cx}, {cy})");
            (lon, lat) = new FrameLink(chip.Wcs.Frame, frame).Apply(lon, lat);
            var v = UnitVector.FromLonLat(lon, lat);
            sx += v.X; sy += v.Y; sz += v.Z;
            scales[i] = LocalScale.At(chip.Wcs, cx, cy);
            if (!(scales[i] > 0) || !double.IsFinite(scales[i]))
                throw new CanvasPlanException($"chip {chip.Name}: its WCS has no usable pixel scale at the chip centre");
        }
        var norm = Math.Sqrt(sx * sx + sy * sy + sz * sz);
        if (!(norm > 1e-9)) throw new CanvasPlanException("the chips' centres cancel out: the field has no centre (chips spread over the whole sky)");
        var (lon0, lat0) = new UnitVector(sx / norm, sy / norm, sz / norm).ToLonLat();
        Array.Sort(scales);
        var n = scales.Length;
        var scale = n % 2 == 1 ? scales[n / 2] : (scales[n / 2 - 1] + scales[n / 2]) / 2;

        // Project every chip's edge with the reference pixel at 0, then shift so the outlines start 1.5 px in.
        var provisional = Mosaic.Wcs.Wcs.From(new Header(MakeCards(frame, lon0, lat0, 0, 0, scale, 1, 1)));
        double minX = double.PositiveInfinity, minY = double.PositiveInfinity, maxX = double.NegativeInfinity, maxY = double.NegativeInfinity;
        foreach (var chip in chips)
        {
            var link = new FrameLink(chip.Wcs.Frame, frame);
            foreach (var (ex, ey) in ChipEdge.Points(chip.Width, chip.Height, BoundsStep))
            {
                if (!chip.Wcs.TryPixelToSky(ex, ey, out var lon, out var lat))
                    throw new CanvasPlanException($"chip {chip.Name}: its WCS gives no sky position at edge pixel ({ex}, {ey})");
                (lon, lat) = link.Apply(lon, lat);
                if (UnitVector.FromLonLat(lon, lat).Dot(UnitVector.FromLonLat(lon0, lat0)) <= 0.01
                    || !provisional.TrySkyToPixel(lon, lat, out var px, out var py))
                    throw new CanvasPlanException($"chip {chip.Name} reaches more than 89° from the field centre: no tangent-plane canvas can hold the field");
                minX = Math.Min(minX, px); maxX = Math.Max(maxX, px);
                minY = Math.Min(minY, py); maxY = Math.Max(maxY, py);
            }
        }
        double shiftX = 1.5 - minX, shiftY = 1.5 - minY;
        double width = Math.Ceiling(maxX + shiftX + 0.5), height = Math.Ceiling(maxY + shiftY + 0.5);
        if (width > MaxSide || height > MaxSide)
            throw new CanvasPlanException($"the field's canvas would be {width:0} x {height:0} pixels; at most {MaxSide} on a side is supported");
        return new CanvasPlan((int)width, (int)height, MakeCards(frame, lon0, lat0, shiftX, shiftY, scale, (int)width, (int)height), chips.ToArray(), scale);
    }

    private static HeaderCard[] MakeCards(CelestialFrame frame, double lon0, double lat0, double crpix1, double crpix2, double scale, int width, int height)
    {
        var galactic = frame.Kind == CelestialFrameKind.Galactic;
        var cards = new List<HeaderCard>
        {
            new("BITPIX", -32L, "resampled physical values"),
            new("NAXIS", 2L, null),
            new("NAXIS1", (long)width, null),
            new("NAXIS2", (long)height, null),
            new("WCSAXES", 2L, null),
            new("CTYPE1", galactic ? "GLON-TAN" : "RA---TAN", "tangent plane about the field centre"),
            new("CTYPE2", galactic ? "GLAT-TAN" : "DEC--TAN", null),
            new("CUNIT1", "deg", null),
            new("CUNIT2", "deg", null),
            new("CRPIX1", crpix1, null),
            new("CRPIX2", crpix2, null),
            new("CRVAL1", lon0, "field centre"),
            new("CRVAL2", lat0, "field centre"),
            new("CD1_1", -scale, "east left"),
            new("CD1_2", 0.0, null),
            new("CD2_1", 0.0, null),
            new("CD2_2", scale, "north up"),
        };
        switch (frame.Kind)
        {
            case CelestialFrameKind.Icrs: cards.Add(new("RADESYS", "ICRS", null)); break;
            case CelestialFrameKind.Fk5:
                cards.Add(new("RADESYS", "FK5", null));
                cards.Add(new("EQUINOX", frame.Equinox ?? 2000.0, null));
                break;
        }
        return cards.ToArray();
    }

    private static string Hash(IReadOnlyList<HeaderCard> cards)
    {
        var text = new StringBuilder();
        foreach (var card in cards)
            text.Append(card.Keyword).Append('=').Append(card.Value switch
            {
                double d => d.ToString("R", CultureInfo.InvariantCulture),
                long l => l.ToString(CultureInfo.InvariantCulture),
                var other => other?.ToString(),
            }).Append('\n');
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }
}
