namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// A stretch from u in [0, 1] (the value's place between the limits) to t in [0, 1]. Only ever evaluated while a
/// tone map is compiled, never per pixel, so it may be as costly as it needs.
/// </summary>
public interface IStretch
{
    /// <summary>Stable text for this stretch and its parameters.</summary>
    string CanonicalKey { get; }

    /// <summary>Fixes the stretch's field-dependent parameters (physical softening, histogram shape, ...) into a curve.</summary>
    IStretchCurve Resolve(StretchContext context);
}
