using System.Runtime.CompilerServices;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>t = ln(1 + a u) / ln(1 + a), a &gt; 0: larger a lifts the faint end more.</summary>
public sealed record LogStretch : IStretch, IStretchCurve
{
    public const string StretchName = "log";
    public const double DefaultA = 1000;

    private readonly double _norm;

    public LogStretch(double a)
    {
        A = StretchParameters.Positive(a, "a");
        _norm = Math.Log(1 + A);
        if (!(_norm > 0) || !double.IsFinite(_norm)) throw new ArgumentOutOfRangeException(nameof(a), a, "a is too small or too large for ln(1 + a)");
        Parameters = new Dictionary<string, double> { ["a"] = A };
    }

    public double A { get; }

    public string Name => StretchName;

    public string CanonicalKey => $"log({KeyText.Number(A)})";

    public IReadOnlyDictionary<string, double> Parameters { get; }

    public IStretchCurve Resolve(StretchContext context) => this;

    // log1p would keep precision for tiny a u; Math has none, and ln(1 + x) loses nothing visible at 8 bits.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Map(double u) => Math.Log(1 + A * StretchParameters.Clamp(u)) / _norm;

    public double Inverse(double t) => Math.Clamp((Math.Exp(StretchParameters.Clamp(t) * _norm) - 1) / A, 0, 1);

    public bool Equals(LogStretch? other) => other is not null && A == other.A;

    public override int GetHashCode() => A.GetHashCode();
}
