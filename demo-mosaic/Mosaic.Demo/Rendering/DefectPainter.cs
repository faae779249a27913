using Mosaic.Demo.Defects;

namespace Mosaic.Demo.Rendering;

/// <summary>Applies a chip's cosmetic defects to its electron image, before noise (the defects collect charge like any pixel).</summary>
internal static class DefectPainter
{
    public static void Apply(Span<float> image, int width, int height, ChipDefects defects)
    {
        foreach (var column in defects.BadColumns)
        for (var y = column.StartRow; y < height; y++)
        {
            ref var pixel = ref image[y * width + column.X];
            pixel = column.Dead ? pixel * (float)column.Response : pixel + (float)column.ExtraElectrons;
        }
        foreach (var hot in defects.HotPixels)
            image[hot.Y * width + hot.X] += (float)hot.ExtraElectrons;
    }
}
