using Mosaic.Canvas;
using Mosaic.Fits;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Canvases;

/// <summary>
/// Gives each field that needs one (see <see cref="CanvasRule"/>) its whole-field canvas after a catalog scan. The
/// plan is made from every band's placeable chips together, so all bands share one grid; chips without a usable
/// celestial WCS are left off and listed. Headers only: cheap. A field whose bands are unchanged keeps its plan
/// and canvases from the scan before; a changed file makes them anew. Not thread-safe: the catalog calls it under
/// its scan lock.
/// </summary>
internal sealed class CanvasCatalog(ILogger logger)
{
    /// <summary>
    /// A camera's chips with their gaps fill most of their canvas; chips scattered over the sky (frames of other
    /// pointings in one folder) would make a vast, nearly empty one. Beyond this many times the largest band's
    /// chip pixels the field gets no canvas.
    /// </summary>
    private const double MaxCanvasToChipArea = 4;

    private Dictionary<string, CachedField> _cache = new(StringComparer.Ordinal);

    public void Attach(IReadOnlyList<Field> fields)
    {
        var next = new Dictionary<string, CachedField>(StringComparer.Ordinal);
        foreach (var field in fields)
            if (Attach(field) is { } cached) next[field.Id] = cached;
        _cache = next;
    }

    private CachedField? Attach(Field field)
    {
        var bands = field.Bands.Where(b => b.Error is null && b.Hdus.Count > 0).ToList();
        if (!CanvasRule.NeedsCanvas(bands)) return null;
        var key = string.Join("|", bands.Select(b => b.Version));
        // A field refused a canvas stays refused (and unlogged) until a file changes.
        if (!_cache.TryGetValue(field.Id, out var cached) || cached.Key != key)
            cached = Make(field, bands, key) ?? new CachedField(key, null, new Dictionary<string, CanvasBand>());
        if (cached.Plan is null) return cached;
        foreach (var band in bands)
            if (cached.Bands.TryGetValue(band.Version, out var canvas))
                band.AttachCanvas(Wrap(band, cached.Plan, canvas));
        return cached;
    }

    private CachedField? Make(Field field, IReadOnlyList<FieldBand> bands, string key)
    {
        var placeable = bands.SelectMany(b => b.Hdus).Where(h => h.Sky.Wcs is not null).ToList();
        if (placeable.Count == 0) return null; // no chip has a WCS: the chips are served one by one, as they are
        CanvasPlan plan;
        var canvases = new Dictionary<string, CanvasBand>(StringComparer.Ordinal);
        try
        {
            plan = CanvasPlan.Create(placeable.Select(h => new ChipFootprint(h.Description, h.Plane.Width, h.Plane.Height, h.Sky.Wcs!)).ToList());
            foreach (var band in bands)
            {
                // A chip is known on the canvas by its index in the band (the FITS index in a band of one file).
                var chips = band.Hdus.Where(h => h.Sky.Wcs is not null).Select(h => new CanvasChip(h.Name, h.Index, h.Plane, h.Sky.Wcs!)).ToList();
                if (chips.Count > 0) canvases[band.Version] = new CanvasBand(plan, chips);
            }
        }
        catch (Exception e) when (e is CanvasPlanException or ArgumentException)
        {
            // The chips are still served one by one; only the whole-field view is missing.
            logger.LogWarning("Field {Field} gets no whole-field canvas: {Reason}", field.Id, e.Message);
            return null;
        }
        var chipArea = bands.Max(b => b.Hdus.Where(h => h.Sky.Wcs is not null).Sum(h => (double)h.Plane.Width * h.Plane.Height));
        var canvasArea = (double)plan.Width * plan.Height;
        if (canvasArea > MaxCanvasToChipArea * chipArea)
        {
            logger.LogWarning("Field {Field} gets no whole-field canvas: its chips are scattered over the sky (a {Width} x {Height} canvas, {Ratio:F0} times their area)",
                field.Id, plan.Width, plan.Height, canvasArea / chipArea);
            return null;
        }
        logger.LogInformation("Field {Field}: whole-field canvas {Width} x {Height} from {Chips} chips", field.Id, plan.Width, plan.Height, placeable.Count);
        return new CachedField(key, plan, canvases);
    }

    private static FieldCanvas Wrap(FieldBand band, CanvasPlan plan, CanvasBand canvas)
    {
        var excluded = band.Hdus.Where(h => h.Sky.Wcs is null)
            .Select(h => new ExcludedChip(h.Index, h.Name, $"no usable celestial WCS: {h.Sky.Error}")).ToList();
        List<HeaderCard> cards = [.. plan.Header.Cards, new HeaderCard("EXTNAME", FieldCanvas.HduName, "the whole-field canvas")];
        if (band.Hdus.Select(h => h.Unit).FirstOrDefault(u => u is not null) is { } unit) cards.Add(new HeaderCard("BUNIT", unit, null));
        var hdu = new Hdu(-1, new Header(cards), 0, 0, 0, canvas.Plane);
        return new FieldCanvas(band, plan, canvas, new FieldHdu(band, hdu, canvas.Plane, -1, FieldCanvas.HduName, file: null, plan.Fingerprint), excluded);
    }

    private sealed record CachedField(string Key, CanvasPlan? Plan, IReadOnlyDictionary<string, CanvasBand> Bands);
}
