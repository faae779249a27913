namespace Mosaic.Demo;

/// <summary>
/// What to generate: the camera's chip grid and the bands. Same options (seed included) → byte-identical files.
/// </summary>
/// <param name="OutputDirectory">The field folder; one file per band is written into it.</param>
/// <param name="GapPixels">Nominal gap between neighbouring chips, in pixels.</param>
public sealed record DemoFieldOptions(
    string OutputDirectory,
    long Seed,
    int ChipWidth,
    int ChipHeight,
    int ChipColumns,
    int ChipRows,
    int GapPixels,
    IReadOnlyList<DemoBand> Bands)
{
    public const long DefaultSeed = 20311014;
    public const int MaxChipSide = 16_384;
    public const long MaxChipPixels = 1L << 27;
    public const int MaxChips = 99;

    /// <summary>8 chips of 2048 × 4096 in 2 rows of 4, about 67 Mpx per band.</summary>
    public static DemoFieldOptions Default(string outputDirectory) =>
        new(outputDirectory, DefaultSeed, 2048, 4096, 4, 2, 80, DemoBand.Standard);

    /// <summary>16 chips of 8192 × 8192 in 4 rows of 4, about 1.07 Gpx per band, for scale tests.</summary>
    public static DemoFieldOptions Large(string outputDirectory) =>
        new(outputDirectory, DefaultSeed, 8192, 8192, 4, 4, 96, DemoBand.Standard);

    /// <summary>8 chips of 256 × 512: the same scene scaled down, generated in about a second.</summary>
    public static DemoFieldOptions Small(string outputDirectory) =>
        new(outputDirectory, DefaultSeed, 256, 512, 4, 2, 40, DemoBand.Standard);

    public int ChipCount => ChipColumns * ChipRows;

    /// <summary>Throws <see cref="ArgumentException"/> naming the first option out of range.</summary>
    public void Validate()
    {
        if (string.IsNullOrWhiteSpace(OutputDirectory))
            throw new ArgumentException("OutputDirectory must name a folder.", nameof(OutputDirectory));
        if (ChipWidth is < 64 or > MaxChipSide)
            throw new ArgumentException($"ChipWidth {ChipWidth} must be in [64, {MaxChipSide}].", nameof(ChipWidth));
        if (ChipHeight is < 64 or > MaxChipSide)
            throw new ArgumentException($"ChipHeight {ChipHeight} must be in [64, {MaxChipSide}].", nameof(ChipHeight));
        if ((long)ChipWidth * ChipHeight > MaxChipPixels)
            throw new ArgumentException($"A chip of {ChipWidth} x {ChipHeight} exceeds {MaxChipPixels} pixels.", nameof(ChipWidth));
        if (ChipColumns < 1 || ChipRows < 1 || ChipColumns * ChipRows > MaxChips)
            throw new ArgumentException($"The chip grid {ChipColumns} x {ChipRows} must have 1 to {MaxChips} chips.", nameof(ChipColumns));
        var maxGap = Math.Min(ChipWidth, ChipHeight) / 2;
        if (GapPixels < 8 || GapPixels > maxGap)
            throw new ArgumentException($"GapPixels {GapPixels} must be in [8, {maxGap}] for {ChipWidth} x {ChipHeight} chips.", nameof(GapPixels));
        if (Bands is null || Bands.Count is < 1 or > 8)
            throw new ArgumentException("Bands must hold 1 to 8 bands.", nameof(Bands));
        var names = new HashSet<string>(StringComparer.Ordinal);
        foreach (var band in Bands)
        {
            if (band is null) throw new ArgumentException("Bands must not contain null.", nameof(Bands));
            band.Validate();
            if (!names.Add(band.Name)) throw new ArgumentException($"Band name '{band.Name}' appears twice.", nameof(Bands));
        }
    }
}
