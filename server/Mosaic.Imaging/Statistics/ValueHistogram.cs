namespace Mosaic.Imaging.Statistics;

/// <summary>
/// CONTRACT STUB (to be implemented): a histogram over the whole float range, binned on the top KeyBits bits of
/// the order-preserving float32 bit pattern (relative bin width 2^-(KeyBits-9)), so one streaming pass needs no
/// prior range. Non-finite values (NaN, ±inf) count as masked. Mergeable across chips; saved with the pyramid.
/// </summary>
public sealed class ValueHistogram
{
    public const int KeyBits = 20;

    public long FiniteCount { get; private set; }
    public long MaskedCount { get; private set; }
    public double Min { get; private set; } = double.NaN;
    public double Max { get; private set; } = double.NaN;
    public double Sum { get; private set; }

    public void Add(ReadOnlySpan<float> values) => throw new NotImplementedException();

    public void Merge(ValueHistogram other) => throw new NotImplementedException();

    /// <summary>The value below which a share p (0..1) of the finite pixels lie, interpolated inside its bin.</summary>
    public double Quantile(double p) => throw new NotImplementedException();

    /// <summary>Share of finite pixels with value ≤ v.</summary>
    public double CumulativeFraction(double v) => throw new NotImplementedException();

    public void Save(Stream stream) => throw new NotImplementedException();

    public static ValueHistogram Load(Stream stream) => throw new NotImplementedException();
}
