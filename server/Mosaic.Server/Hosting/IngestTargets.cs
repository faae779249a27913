using Mosaic.Server.Fields;

namespace Mosaic.Server.Hosting;

/// <summary>The pyramids the server builds for a field, in the order it queues them: every chip, then the bands' canvases.</summary>
internal static class IngestTargets
{
    public static IEnumerable<FieldHdu> Of(Field field)
    {
        var bands = field.Bands.Where(b => b.Error is null).ToList();
        return bands.SelectMany(b => b.Hdus).Concat(bands.Select(b => b.Canvas?.Hdu).OfType<FieldHdu>());
    }
}
