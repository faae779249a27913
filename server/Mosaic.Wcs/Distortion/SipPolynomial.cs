using Mosaic.Wcs.Header;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Distortion;

/// <summary>One SIP polynomial sum_{p+q&lt;=order} K_p_q u^p v^q (Shupe et al. 2005), with its partial derivatives.</summary>
public sealed class SipPolynomial
{
    /// <summary>Highest order read; the SIP convention in practice stays well below this.</summary>
    public const int MaxOrder = 9;

    private readonly double[] _c;   // row-major [p * (Order + 1) + q]

    public int Order { get; }

    public SipPolynomial(int order, double[] coefficients)
    {
        Order = order;
        _c = coefficients;
    }

    /// <summary>Reads prefix_ORDER and prefix_p_q; null when prefix_ORDER is absent.</summary>
    /// <exception cref="WcsHeaderException">The order or a coefficient is malformed.</exception>
    public static SipPolynomial? From(FitsHeader header, string prefix)
    {
        var orderKey = prefix + "_ORDER";
        if (!header.Contains(orderKey)) return null;
        var order = header.GetLong(orderKey) ?? throw new WcsHeaderException(orderKey, "must be an integer");
        if (order is < 0 or > MaxOrder) throw new WcsHeaderException(orderKey, $"must be between 0 and {MaxOrder}, got {order}");
        var n = (int)order + 1;
        var c = new double[n * n];
        for (var p = 0; p < n; p++)
            for (var q = 0; p + q < n; q++)
            {
                var key = $"{prefix}_{p}_{q}";
                if (header.Find(key) is not { } card) continue;
                var value = header.GetDouble(key) ?? throw new WcsHeaderException(key, $"must be a number, got '{card.Value}'");
                if (!double.IsFinite(value)) throw new WcsHeaderException(key, "must be finite");
                c[p * n + q] = value;
            }
        return new SipPolynomial((int)order, c);
    }

    public double Evaluate(double u, double v)
    {
        var n = Order + 1;
        double sum = 0, up = 1;
        for (var p = 0; p < n; p++, up *= u)
        {
            double vq = 1;
            for (var q = 0; p + q < n; q++, vq *= v) sum += _c[p * n + q] * up * vq;
        }
        return sum;
    }

    /// <summary>Value and the partial derivatives along u and v.</summary>
    public (double Value, double DU, double DV) EvaluateWithGradient(double u, double v)
    {
        var n = Order + 1;
        Span<double> pu = stackalloc double[MaxOrder + 2];
        Span<double> pv = stackalloc double[MaxOrder + 2];
        pu[0] = pv[0] = 1;
        for (var k = 1; k <= n; k++) { pu[k] = pu[k - 1] * u; pv[k] = pv[k - 1] * v; }
        double f = 0, du = 0, dv = 0;
        for (var p = 0; p < n; p++)
            for (var q = 0; p + q < n; q++)
            {
                var c = _c[p * n + q];
                if (c == 0) continue;
                f += c * pu[p] * pv[q];
                if (p > 0) du += c * p * pu[p - 1] * pv[q];
                if (q > 0) dv += c * q * pu[p] * pv[q - 1];
            }
        return (f, du, dv);
    }
}
