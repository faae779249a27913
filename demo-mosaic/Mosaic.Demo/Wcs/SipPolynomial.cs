namespace Mosaic.Demo.Wcs;

/// <summary>
/// One polynomial of the SIP convention (Shupe et al. 2005): Σ c_pq u^p v^q over p + q ≤ Order, with u and v the
/// pixel offsets from CRPIX. The same type holds a forward (A, B) and an inverse (AP, BP) polynomial.
/// </summary>
public sealed class SipPolynomial
{
    public const int MaxOrder = 9;

    private readonly double[] _coefficients;

    /// <param name="coefficients">Indexed [p, q]; entries with p + q above the order must be zero.</param>
    public SipPolynomial(int order, double[,] coefficients)
    {
        if (order is < 0 or > MaxOrder)
            throw new ArgumentOutOfRangeException(nameof(order), order, $"A SIP order must be in 0..{MaxOrder}.");
        if (coefficients.GetLength(0) != order + 1 || coefficients.GetLength(1) != order + 1)
            throw new ArgumentException($"coefficients must be {order + 1} x {order + 1}.", nameof(coefficients));
        Order = order;
        _coefficients = new double[(order + 1) * (order + 1)];
        for (var p = 0; p <= order; p++)
        for (var q = 0; q <= order; q++)
        {
            var c = coefficients[p, q];
            if (!double.IsFinite(c)) throw new ArgumentException($"Coefficient [{p}, {q}] is not finite.", nameof(coefficients));
            if (p + q > order && c != 0)
                throw new ArgumentException($"Coefficient [{p}, {q}] lies above order {order}.", nameof(coefficients));
            _coefficients[p * (order + 1) + q] = c;
        }
    }

    public int Order { get; }

    public double this[int p, int q] =>
        p >= 0 && q >= 0 && p + q <= Order ? _coefficients[p * (Order + 1) + q] : 0.0;

    /// <summary>Every term with p + q in [minimumDegree, Order], zeros included, in the usual header order.</summary>
    public IEnumerable<(int P, int Q, double Coefficient)> Terms(int minimumDegree)
    {
        for (var degree = minimumDegree; degree <= Order; degree++)
        for (var p = degree; p >= 0; p--)
            yield return (p, degree - p, this[p, degree - p]);
    }

    public double Evaluate(double u, double v) => Evaluate(u, v, out _, out _);

    /// <summary>The value and its partial derivatives, for Newton inversion.</summary>
    public double Evaluate(double u, double v, out double dU, out double dV)
    {
        Span<double> up = stackalloc double[MaxOrder + 1];
        Span<double> vp = stackalloc double[MaxOrder + 1];
        up[0] = 1;
        vp[0] = 1;
        for (var i = 1; i <= Order; i++)
        {
            up[i] = up[i - 1] * u;
            vp[i] = vp[i - 1] * v;
        }
        double value = 0, du = 0, dv = 0;
        var stride = Order + 1;
        for (var p = 0; p <= Order; p++)
        for (var q = 0; q <= Order - p; q++)
        {
            var c = _coefficients[p * stride + q];
            if (c == 0) continue;
            value += c * up[p] * vp[q];
            if (p > 0) du += c * p * up[p - 1] * vp[q];
            if (q > 0) dv += c * q * up[p] * vp[q - 1];
        }
        dU = du;
        dV = dv;
        return value;
    }
}
