using System.Runtime.CompilerServices;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>The asinh stretch with every parameter physical: t(u) for v = lo + u (hi - lo).</summary>
public sealed class AsinhCurve : IStretchCurve
{
    private readonly double _lo;
    private readonly double _width;
    private readonly double _soft;
    private readonly double _pivot;
    private readonly double _fLo;
    private readonly double _fSpan;

    public AsinhCurve(double lo, double hi, double soft, double pivot)
    {
        if (!double.IsFinite(lo)) throw new ArgumentOutOfRangeException(nameof(lo), lo, "lo must be finite");
        if (!double.IsFinite(hi) || !(hi > lo)) throw new ArgumentOutOfRangeException(nameof(hi), hi, "hi must be finite and > lo");
        if (!(soft > 0) || !double.IsFinite(soft)) throw new ArgumentOutOfRangeException(nameof(soft), soft, "soft must be > 0");
        if (!double.IsFinite(pivot)) throw new ArgumentOutOfRangeException(nameof(pivot), pivot, "pivot must be finite");
        _lo = lo;
        _width = hi - lo;
        _soft = soft;
        _pivot = pivot;
        _fLo = F(lo);
        _fSpan = F(hi) - _fLo;
        if (!(_fSpan > 0) || !double.IsFinite(_fSpan))
            throw new ArgumentException("soft is too large or too small against hi - lo: asinh((hi - c)/soft) - asinh((lo - c)/soft) must be > 0 and finite", nameof(soft));
    }

    public string Name => AsinhStretch.StretchName;

    public IReadOnlyDictionary<string, double> Parameters => new Dictionary<string, double> { ["soft"] = _soft, ["pivot"] = _pivot };

    public double Inverse(double t)
    {
        var f = _fLo + Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1) * _fSpan;
        var v = _pivot + _soft * Math.Sinh(f);
        return Math.Clamp((v - _lo) / _width, 0, 1);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Map(double u)
    {
        var t = (F(_lo + Math.Clamp(u, 0, 1) * _width) - _fLo) / _fSpan;
        return Math.Clamp(t, 0, 1);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private double F(double v) => Math.Asinh((v - _pivot) / _soft);
}
