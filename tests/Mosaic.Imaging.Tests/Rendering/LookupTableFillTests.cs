using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Tests.Rendering;

/// <summary>
/// The table is filled by splitting only the stretches of entries whose ends differ, which is exact for a level
/// function monotone in u. Checked here against evaluating the level of every entry directly, for every curve and
/// palette family, gentle and steep, increasing and decreasing (the inverted gray palette).
/// </summary>
public sealed class LookupTableFillTests
{
    public static TheoryData<string, int> Cases()
    {
        var data = new TheoryData<string, int>();
        foreach (var curve in Curves.Keys)
        foreach (var entries in new[] { 256, 4096, 1 << 16 })
            data.Add(curve, entries);
        return data;
    }

    private static readonly Dictionary<string, IStretchCurve> Curves = new()
    {
        ["linear"] = new LinearStretch(),
        ["sqrt"] = new SqrtStretch(),
        ["log a=1000"] = new LogStretch(1000),
        ["power gamma=3"] = new PowerStretch(3),
        ["asinh soft=36"] = new AsinhCurve(36, 4000, 36, 36),
        ["asinh steep"] = new AsinhCurve(0, 65535, 3, 0),
        ["asinh pivot inside"] = new AsinhCurve(-50, 950, 20, 100),
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Every_entry_has_the_level_of_its_own_u(string curve, int entries)
    {
        foreach (IPalette palette in new IPalette[] { new GrayPalette(), new InvertedGrayPalette(), new CubehelixPalette() })
        {
            var levelOf = new LevelFunction(Curves[curve], palette);
            var table = LookupTable.Build(new ValueRange(0, 1), levelOf, entries);
            double last = entries - 1;
            var largestStep = 0;
            var previous = levelOf.At(0);
            for (var i = 0; i < entries; i++)
            {
                var direct = levelOf.At(i / last);
                if (table[i] != direct)
                    Assert.Fail($"{curve}, {palette.GetType().Name}, {entries} entries: entry {i} holds {table[i]}, its own level is {direct}");
                largestStep = Math.Max(largestStep, Math.Abs(direct - previous));
                previous = direct;
            }
            // The step the fill reports decides the table's size: it must be the largest between neighbours' own levels.
            Assert.Equal(largestStep, table.LargestStep);
        }
    }
}
