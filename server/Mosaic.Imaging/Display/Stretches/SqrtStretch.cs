namespace Mosaic.Imaging.Display.Stretches;

/// <summary>t = sqrt(u).</summary>
public sealed record SqrtStretch : IStretch, IStretchCurve
{
    public const string StretchName = "sqrt";

    public string Name => StretchName;

    public string CanonicalKey => StretchName;

    public IReadOnlyDictionary<string, double> Parameters => StretchParameters.None;

    public IStretchCurve Resolve(StretchContext context) => this;

    public double Map(double u) => Math.Sqrt(StretchParameters.Clamp(u));

    public double Inverse(double t)
    {
        var c = StretchParameters.Clamp(t);
        return c * c;
    }
}
