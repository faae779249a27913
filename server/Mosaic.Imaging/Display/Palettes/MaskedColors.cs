using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>Picks a palette's default masked colour: the candidate farthest (CIE76) from its nearest palette colour.</summary>
internal static class MaskedColors
{
    // Saturated colours of every hue: at least one lies far from any palette monotone in lightness.
    private static readonly Rgb[] Candidates =
    [
        new(255, 0, 255), new(0, 255, 0), new(0, 255, 255), new(255, 0, 0), new(0, 0, 255),
        new(255, 255, 0), new(255, 128, 0), new(128, 0, 255), new(0, 255, 128), new(255, 0, 128),
    ];

    public static Rgb FarthestFrom(IPalette palette)
    {
        var entries = new CieLab[256];
        for (var i = 0; i < entries.Length; i++) entries[i] = CieLab.From(palette.Color(i / 255.0));
        var best = Candidates[0];
        var bestDistance = -1.0;
        foreach (var candidate in Candidates)
        {
            var lab = CieLab.From(candidate);
            var nearest = double.MaxValue;
            foreach (var e in entries) nearest = Math.Min(nearest, lab.DistanceTo(e));
            if (nearest > bestDistance) (best, bestDistance) = (candidate, nearest);
        }
        return best;
    }
}
