using System.Numerics;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// Display settings compiled for the tile loop: limits, stretch and palette folded into one table from the value's
/// place u between the limits to the 8-bit level. The table is sized so neighbouring entries differ by at most one
/// level, which keeps every pixel within 1 DN of the exact formula; a curve too steep for the largest table is
/// served exactly from its level breakpoints instead. Immutable and thread-safe.
/// </summary>
public sealed class ToneMap
{
    /// <summary>
    /// Smallest table. Measured: 4 Ki to 256 Ki entries apply equally fast (the gathers dominate), while the share
    /// of pixels one level off the exact formula falls from ~3% (4 Ki) to ~0.2% (64 Ki); past 64 Ki compiling slows.
    /// </summary>
    public const int DefaultEntries = 1 << 16;

    /// <summary>Largest table: past 2^20 a float32 index would step by more than an eighth of an entry.</summary>
    public const int MaximumEntries = 1 << 20;

    private readonly LookupTable? _table;
    private readonly LevelBreaks? _breaks;

    private ToneMap(ValueRange limits, LookupTable? table, LevelBreaks? breaks, IPalette palette, MaskedColor masked)
    {
        Lo = limits.Lo;
        Hi = limits.Hi;
        _table = table;
        _breaks = breaks;
        Palette = palette;
        Masked = masked;
        IsGray = palette.IsGray;
        if (!IsGray) PaletteBytes = PaletteEntries.For(palette, masked);
    }

    /// <summary>Value shown at the lowest level (u = 0).</summary>
    public double Lo { get; }

    /// <summary>Value shown at the highest level (u = 1).</summary>
    public double Hi { get; }

    /// <summary>The palette compiled in.</summary>
    public IPalette Palette { get; }

    /// <summary>How masked pixels are drawn (from the display settings; a region render may override it).</summary>
    public MaskedColor Masked { get; }

    /// <summary>
    /// True where levels are grays (level = gray DN, written as 8-bit grayscale); false where a level is an index
    /// into <see cref="PaletteBytes"/>: index 0 is reserved for masked pixels, index k = 1..255 is the palette at
    /// t = (k - 1) / 254, so a colour palette shows 255 steps.
    /// </summary>
    public bool IsGray { get; }

    /// <summary>The 256 colours of an indexed tile as PLTE bytes (r, g, b per index), index 0 the masked colour (black when transparent); null for gray.</summary>
    internal byte[]? PaletteBytes { get; }

    /// <summary>Entries in the lookup table; 0 where the curve is too steep for any table and levels come from breakpoints.</summary>
    public int TableEntries => _table?.Entries ?? 0;

    /// <summary>Bytes this map holds (table or breakpoints, palette, the object itself): what a cache of compiled displays counts.</summary>
    public long RetainedBytes => ObjectBytes + (_table?.RetainedBytes ?? 0) + (_breaks?.RetainedBytes ?? 0) + (PaletteBytes?.Length ?? 0);

    // This object's fields and the array headers it points at, roughly (common practice: 24 bytes an array on 64-bit).
    private const long ObjectBytes = 128;

    /// <summary>
    /// Compiles a curve and palette over the limits. <paramref name="minimumEntries"/> (a power of two from 256 to
    /// <see cref="MaximumEntries"/>) is where the table search starts; it grows until the 1 DN bound holds.
    /// </summary>
    public static ToneMap Create(ValueRange limits, IStretchCurve curve, IPalette palette, int minimumEntries = DefaultEntries)
        => Create(limits, curve, palette, MaskedColor.Transparent, minimumEntries);

    /// <summary>As above, with how masked pixels are drawn.</summary>
    public static ToneMap Create(ValueRange limits, IStretchCurve curve, IPalette palette, MaskedColor masked, int minimumEntries = DefaultEntries)
    {
        ArgumentNullException.ThrowIfNull(curve);
        ArgumentNullException.ThrowIfNull(palette);
        if (!FieldLimits.IsUsable(limits.Lo, limits.Hi))
            throw new ArgumentOutOfRangeException(nameof(limits), limits, "limits must be finite within float32 range with hi - lo not below float32 resolution");
        if (minimumEntries < 256 || minimumEntries > MaximumEntries || !BitOperations.IsPow2(minimumEntries))
            throw new ArgumentOutOfRangeException(nameof(minimumEntries), minimumEntries, $"minimumEntries must be a power of two from 256 to {MaximumEntries}");

        var levelOf = new LevelFunction(curve, palette);
        for (var entries = minimumEntries; ; )
        {
            var table = LookupTable.Build(limits, levelOf, entries);
            var step = table.LargestStep;
            if (step <= 1) return new ToneMap(limits, table, null, palette, masked);
            if (entries == MaximumEntries) return new ToneMap(limits, null, LevelBreaks.Find(limits, levelOf, table), palette, masked);
            // Jump straight to about the size the measured slope asks for rather than doubling blindly.
            var wanted = (long)entries * step;
            entries = (int)Math.Min(MaximumEntries, Math.Max(2L * entries, (long)BitOperations.RoundUpToPowerOf2((ulong)wanted)));
        }
    }

    /// <summary>The same levels with another masked colour (a region render's own), sharing the compiled table.</summary>
    public ToneMap WithMasked(MaskedColor masked)
        => masked == Masked ? this : new ToneMap(new ValueRange(Lo, Hi), _table, _breaks, Palette, masked);

    /// <summary>
    /// Levels for values; returns how many were masked (NaN), whose level is 0. Values below Lo get the level of
    /// u = 0, above Hi that of u = 1 (±infinity included). <paramref name="levels"/> must be at least as long as
    /// <paramref name="values"/>. Allocates nothing.
    /// </summary>
    public int Apply(ReadOnlySpan<float> values, Span<byte> levels)
    {
        if (levels.Length < values.Length)
            throw new ArgumentException($"levels holds {levels.Length} bytes but values has {values.Length}", nameof(levels));
        return _table is { } table ? table.Apply(values, levels) : _breaks!.Apply(values, levels);
    }

    /// <summary>Apply through one chosen loop, for tests comparing the paths.</summary>
    internal int Apply(ReadOnlySpan<float> values, Span<byte> levels, LookupPath path)
    {
        if (levels.Length < values.Length)
            throw new ArgumentException($"levels holds {levels.Length} bytes but values has {values.Length}", nameof(levels));
        return _table is { } table ? table.Apply(values, levels, path) : _breaks!.Apply(values, levels);
    }

    /// <summary>The level of one value, as <see cref="Apply"/> would give it.</summary>
    public byte LevelOf(float value)
    {
        Span<byte> level = stackalloc byte[1];
        Apply(new ReadOnlySpan<float>(in value), level);
        return level[0];
    }
}
