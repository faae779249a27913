namespace Mosaic.Imaging.Display.Stretches;

/// <summary>t = u.</summary>
public sealed record LinearStretch : IStretch, IStretchCurve
{
    public const string StretchName = "linear";

    public string Name => StretchName;

    public string CanonicalKey => StretchName;

    public IReadOnlyDictionary<string, double> Parameters => StretchParameters.None;

    public IStretchCurve Resolve(StretchContext context) => this;

    public double Map(double u) => StretchParameters.Clamp(u);

    public double Inverse(double t) => StretchParameters.Clamp(t);
}
