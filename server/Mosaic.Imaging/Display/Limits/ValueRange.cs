namespace Mosaic.Imaging.Display.Limits;

/// <summary>Physical values shown from black (Lo) to white (Hi); always Lo &lt; Hi, both finite.</summary>
public readonly record struct ValueRange
{
    public ValueRange(double lo, double hi)
    {
        if (!double.IsFinite(lo)) throw new ArgumentOutOfRangeException(nameof(lo), lo, "lo must be finite");
        if (!double.IsFinite(hi)) throw new ArgumentOutOfRangeException(nameof(hi), hi, "hi must be finite");
        if (!(lo < hi)) throw new ArgumentException($"lo ({lo}) must be < hi ({hi})", nameof(hi));
        if (!double.IsFinite(hi - lo)) throw new ArgumentException("hi - lo must be finite", nameof(hi));
        Lo = lo;
        Hi = hi;
    }

    public double Lo { get; }
    public double Hi { get; }
    public double Width => Hi - Lo;
}
