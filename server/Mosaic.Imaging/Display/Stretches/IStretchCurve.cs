namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// A resolved stretch: t(u) for u in [0, 1], non-decreasing, with t in [0, 1]. Monotony is what lets a lookup
/// table bound its error by the step between neighbouring entries.
/// </summary>
public interface IStretchCurve
{
    /// <summary>The stretch's name as in URLs (linear, sqrt, power, log, asinh, histeq).</summary>
    string Name { get; }

    /// <summary>The parameters as resolved for the field, in physical units where they have any (soft, pivot).</summary>
    IReadOnlyDictionary<string, double> Parameters { get; }

    double Map(double u);

    /// <summary>The u in [0, 1] that maps to t (t clamped to [0, 1]): where a colour bar places the colour of t.</summary>
    double Inverse(double t);
}
