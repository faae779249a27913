namespace Mosaic.Imaging.Rendering;

/// <summary>CONTRACT STUB: display settings compiled to a lookup table from value to 8-bit level.</summary>
public sealed class ToneMap
{
    public double Lo { get; init; }
    public double Hi { get; init; }

    /// <summary>Levels for values; returns how many were masked (NaN), whose level is left 0.</summary>
    public int Apply(ReadOnlySpan<float> values, Span<byte> levels) => throw new NotImplementedException();
}
