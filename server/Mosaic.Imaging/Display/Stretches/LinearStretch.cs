namespace Mosaic.Imaging.Display.Stretches;

/// <summary>t = u.</summary>
public sealed record LinearStretch : IStretch, IStretchCurve
{
    public string CanonicalKey => "linear";

    public IStretchCurve Resolve(StretchContext context) => this;

    public double Map(double u) => Math.Clamp(u, 0, 1);
}
