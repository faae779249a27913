using System.Globalization;
using System.Text.Json;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// Where FITS pixel positions are on screen, read from the tiles themselves: the tile grid's top-left corner is the
/// image's corner (x = 0.5, y = height + 0.5) and one image pixel spans <see cref="Scale"/> screen pixels (the pixel
/// CRS contract, pixel-crs.js). Exact where the ideal view centre is not: Leaflet puts the map's corner on a whole
/// screen pixel, up to half a pixel from the middle of the view.
/// </summary>
public sealed record TileMapping(double CornerX, double CornerY, double Scale, int ImageHeight)
{
    /// <summary>From the first loaded image tile, its address ({z}/{x}/{y}) and its box on screen.</summary>
    public static async Task<TileMapping> ReadAsync(ViewerPage viewer, int imageHeight, double scale)
    {
        var json = await viewer.Page.EvaluateAsync<string>(
            @"() => { const view = document.getElementById('image-view').getBoundingClientRect();
                      const t = [...document.querySelectorAll('#image-view .image-tiles img.leaflet-tile')].find(i => i.complete && i.naturalWidth > 0);
                      const r = t.getBoundingClientRect();
                      return JSON.stringify({ src: t.src, left: r.left - view.left, top: r.top - view.top, width: r.width, height: r.height }); }");
        var tile = JsonDocument.Parse(json).RootElement;
        var path = new Uri(tile.GetProperty("src").GetString()!).AbsolutePath.Split('/');
        var (tx, ty) = (int.Parse(path[^2], CultureInfo.InvariantCulture), int.Parse(path[^1].Split('.')[0], CultureInfo.InvariantCulture));
        var (left, top) = (tile.GetProperty("left").GetDouble(), tile.GetProperty("top").GetDouble());
        return new TileMapping(left - tx * tile.GetProperty("width").GetDouble(), top - ty * tile.GetProperty("height").GetDouble(), scale, imageHeight);
    }

    public (double X, double Y) ToFits(double containerX, double containerY) =>
        (0.5 + (containerX - CornerX) / Scale, ImageHeight + 0.5 - (containerY - CornerY) / Scale);

    public (double X, double Y) ToContainer(double fitsX, double fitsY) =>
        (CornerX + (fitsX - 0.5) * Scale, CornerY + (ImageHeight + 0.5 - fitsY) * Scale);
}
