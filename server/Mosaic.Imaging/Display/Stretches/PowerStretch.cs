using System.Runtime.CompilerServices;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>t = u^gamma, gamma &gt; 0: above 1 it darkens the faint end, below 1 it lifts it.</summary>
public sealed record PowerStretch : IStretch, IStretchCurve
{
    public const string StretchName = "power";
    public const double DefaultGamma = 2;

    public PowerStretch(double gamma)
    {
        Gamma = StretchParameters.Positive(gamma, "gamma");
        Parameters = new Dictionary<string, double> { ["gamma"] = Gamma };
    }

    public double Gamma { get; }

    public string Name => StretchName;

    public string CanonicalKey => $"power({KeyText.Number(Gamma)})";

    public IReadOnlyDictionary<string, double> Parameters { get; }

    public IStretchCurve Resolve(StretchContext context) => this;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Map(double u) => Math.Pow(StretchParameters.Clamp(u), Gamma);

    public double Inverse(double t) => Math.Pow(StretchParameters.Clamp(t), 1 / Gamma);

    public bool Equals(PowerStretch? other) => other is not null && Gamma == other.Gamma;

    public override int GetHashCode() => Gamma.GetHashCode();
}
