using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// Composite settings compiled for the tile loop: three rows of values in, three rows of 8-bit channel levels out.
/// Immutable and thread-safe. Levels of a pixel masked (NaN) in any band are left for the composer to overwrite.
/// </summary>
public abstract class CompositeMap
{
    private protected CompositeMap(MaskedColor masked) => Masked = masked;

    /// <summary>How pixels masked in any band are drawn.</summary>
    public MaskedColor Masked { get; }

    /// <summary>Channel levels for one run of pixels; all six spans the same length. Allocates nothing.</summary>
    public void Apply(ReadOnlySpan<float> red, ReadOnlySpan<float> green, ReadOnlySpan<float> blue,
        Span<byte> redLevels, Span<byte> greenLevels, Span<byte> blueLevels)
    {
        var n = red.Length;
        if (green.Length != n || blue.Length != n)
            throw new ArgumentException($"the three value runs differ in length ({red.Length}, {green.Length}, {blue.Length})", nameof(green));
        if (redLevels.Length < n || greenLevels.Length < n || blueLevels.Length < n)
            throw new ArgumentException($"each level run must hold at least {n} bytes", nameof(redLevels));
        ApplyCore(red, green, blue, redLevels[..n], greenLevels[..n], blueLevels[..n]);
    }

    /// <summary>The same levels with another masked colour (a region render's own).</summary>
    public abstract CompositeMap WithMasked(MaskedColor masked);

    private protected abstract void ApplyCore(ReadOnlySpan<float> red, ReadOnlySpan<float> green, ReadOnlySpan<float> blue,
        Span<byte> redLevels, Span<byte> greenLevels, Span<byte> blueLevels);
}
