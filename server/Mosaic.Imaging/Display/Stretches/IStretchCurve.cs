namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// A resolved stretch: t(u) for u in [0, 1], non-decreasing, with t in [0, 1]. Monotony is what lets a lookup
/// table bound its error by the step between neighbouring entries.
/// </summary>
public interface IStretchCurve
{
    double Map(double u);
}
