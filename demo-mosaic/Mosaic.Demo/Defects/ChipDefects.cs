using Mosaic.Demo.Randomness;

namespace Mosaic.Demo.Defects;

/// <summary>The cosmetic defects of one chip. They belong to the detector, so every band shows the same ones.</summary>
public sealed class ChipDefects
{
    private ChipDefects(IReadOnlyList<HotPixel> hotPixels, IReadOnlyList<BadColumn> badColumns)
    {
        HotPixels = hotPixels;
        BadColumns = badColumns;
    }

    public IReadOnlyList<HotPixel> HotPixels { get; }

    public IReadOnlyList<BadColumn> BadColumns { get; }

    internal static ChipDefects Draw(long seed, int chipIndex, int width, int height)
    {
        var rng = Xoshiro256StarStar.For(seed, RandomStream.Defects, chipIndex);
        // About one hot pixel in 60 000, a common grade for science CCDs.
        var hotCount = Math.Max(1, (int)Math.Round(width * (double)height / 60_000));
        var hot = new HotPixel[hotCount];
        for (var i = 0; i < hotCount; i++)
        {
            var x = rng.NextInt(width);
            var y = rng.NextInt(height);
            hot[i] = new HotPixel(x, y, Math.Round(Math.Exp(rng.Uniform(Math.Log(2_000), Math.Log(45_000)))));
        }

        var columnCount = 1 + (rng.NextDouble() < 0.5 ? 1 : 0);
        var columns = new BadColumn[columnCount];
        for (var i = 0; i < columnCount; i++)
        {
            var x = (int)(width * rng.Uniform(0.05, 0.95));
            var start = (int)(height * rng.Uniform(0.0, 0.8));
            var dead = rng.NextDouble() < 0.4;
            columns[i] = dead
                ? new BadColumn(x, start, true, 0, Math.Round(rng.Uniform(0.02, 0.08), 3))
                : new BadColumn(x, start, false, Math.Round(rng.Uniform(150, 450)), 1.0);
        }
        return new ChipDefects(hot, columns);
    }
}
