using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>The histeq stretch resolved against a histogram; linear where no pixel lies within the limits.</summary>
public sealed class HistEqCurve : IStretchCurve
{
    private readonly ValueHistogram _histogram;
    private readonly double _lo;
    private readonly double _width;
    private readonly double _fLo;
    private readonly double _fSpan;

    public HistEqCurve(ValueRange limits, ValueHistogram histogram)
    {
        _histogram = histogram ?? throw new ArgumentNullException(nameof(histogram), "histogram must be given");
        _lo = limits.Lo;
        _width = limits.Width;
        if (histogram.FiniteCount > 0)
        {
            // Pixels exactly at lo belong to [lo, v]: start just below lo.
            _fLo = histogram.CumulativeFraction(Math.BitDecrement(limits.Lo));
            _fSpan = histogram.CumulativeFraction(limits.Hi) - _fLo;
        }
    }

    public string Name => HistEqStretch.StretchName;

    public IReadOnlyDictionary<string, double> Parameters => StretchParameters.None;

    /// <summary>False where the limits hold no pixel and the curve falls back to linear.</summary>
    public bool HasPixels => _fSpan > 0;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Map(double u)
    {
        var c = StretchParameters.Clamp(u);
        if (!HasPixels) return c;
        var v = _lo + c * _width;
        return Math.Clamp((_histogram.CumulativeFraction(v) - _fLo) / _fSpan, 0, 1);
    }

    public double Inverse(double t)
    {
        var c = StretchParameters.Clamp(t);
        if (!HasPixels) return c;
        var v = _histogram.Quantile(Math.Clamp(_fLo + c * _fSpan, 0, 1));
        return Math.Clamp((v - _lo) / _width, 0, 1);
    }
}
