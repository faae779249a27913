using Mosaic.Wcs.Header;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Distortion;

/// <summary>
/// One axis of the TPV distortion: sum_m PVi_m u^a v^b r^c over the 40 terms of the convention (up to seventh
/// order, with the odd powers of r = sqrt(u^2 + v^2) at m = 3, 11, 23, 39), u being this axis's own intermediate
/// coordinate and v the other's, both in degrees. Missing coefficients are zero.
/// </summary>
public sealed class TpvPolynomial
{
    public const int TermCount = 40;

    /// <summary>Exponents (of u, v, r) of term m, in the convention's order: per order n, u^n, u^(n-1) v, ..., v^n, then r^n for odd n.</summary>
    private static readonly (int U, int V, int R)[] Powers = BuildPowers();

    private readonly double[] _c;
    private readonly int _highestTerm;

    public TpvPolynomial(double[] coefficients)
    {
        ArgumentNullException.ThrowIfNull(coefficients);
        if (coefficients.Length != TermCount) throw new ArgumentException($"TPV has {TermCount} terms per axis", nameof(coefficients));
        _c = coefficients;
        _highestTerm = Array.FindLastIndex(coefficients, c => c != 0);
    }

    public double this[int m] => _c[m];

    /// <summary>PV{axis}_0..39 of <paramref name="header"/>.</summary>
    /// <exception cref="WcsHeaderException">A coefficient is malformed, or a PV{axis}_m with m &gt; 39 is present.</exception>
    public static TpvPolynomial From(FitsHeader header, int axis)
    {
        ArgumentNullException.ThrowIfNull(header);
        var c = new double[TermCount];
        for (var m = 0; m < TermCount; m++)
        {
            var key = $"PV{axis}_{m}";
            if (header.Find(key) is not { } card) continue;
            var value = header.GetDouble(key) ?? throw new WcsHeaderException(key, $"must be a number, got '{card.Value}'");
            if (!double.IsFinite(value)) throw new WcsHeaderException(key, "must be finite");
            c[m] = value;
        }
        for (var m = TermCount; m < 100; m++)
            if (header.Contains($"PV{axis}_{m}")) throw new WcsHeaderException($"PV{axis}_{m}", $"TPV has terms PV{axis}_0 to PV{axis}_{TermCount - 1} only");
        return new TpvPolynomial(c);
    }

    /// <summary>Value and partial derivatives along u (own axis) and v (other axis).</summary>
    public (double Value, double DU, double DV) Evaluate(double u, double v)
    {
        Span<double> pu = stackalloc double[8];
        Span<double> pv = stackalloc double[8];
        pu[0] = pv[0] = 1;
        for (var k = 1; k < 8; k++) { pu[k] = pu[k - 1] * u; pv[k] = pv[k - 1] * v; }
        var r = Math.Sqrt(u * u + v * v);
        double f = 0, du = 0, dv = 0;
        for (var m = 0; m <= _highestTerm; m++)
        {
            var c = _c[m];
            if (c == 0) continue;
            var (a, b, k) = Powers[m];
            if (k > 0)
            {
                var rk = Math.Pow(r, k);
                f += c * rk;
                // d(r^k)/du = k r^(k-2) u; at r = 0 the odd powers have no slope worth following (0 is the subgradient).
                if (r > 0)
                {
                    var g = c * k * rk / (r * r);
                    du += g * u;
                    dv += g * v;
                }
                continue;
            }
            f += c * pu[a] * pv[b];
            if (a > 0) du += c * a * pu[a - 1] * pv[b];
            if (b > 0) dv += c * b * pu[a] * pv[b - 1];
        }
        return (f, du, dv);
    }

    private static (int, int, int)[] BuildPowers()
    {
        var powers = new List<(int, int, int)> { (0, 0, 0) };
        for (var n = 1; n <= 7; n++)
        {
            for (var j = 0; j <= n; j++) powers.Add((n - j, j, 0));
            if (n % 2 == 1) powers.Add((0, 0, n));
        }
        return powers.ToArray();
    }
}
