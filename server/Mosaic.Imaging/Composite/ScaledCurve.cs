using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Composite;

/// <summary>A channel's stretch times its weight, clipped to 1: still monotone, so the tone map's 1 DN bound holds.</summary>
internal sealed class ScaledCurve(IStretchCurve curve, double scale) : IStretchCurve
{
    public string Name => curve.Name;

    public IReadOnlyDictionary<string, double> Parameters => curve.Parameters;

    public double Map(double u) => Math.Min(1, scale * curve.Map(u));

    public double Inverse(double t) => curve.Inverse(Math.Clamp(t / scale, 0, 1));
}
