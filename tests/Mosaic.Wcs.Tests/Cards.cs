using Mosaic.Fits;

namespace Mosaic.Wcs.Tests;

/// <summary>Builds the same card set as a Mosaic header and as input for the astropy reference.</summary>
internal static class Cards
{
    public static Fits.Header ToHeader(IReadOnlyDictionary<string, object> cards) =>
        new(cards.Select(c => new HeaderCard(c.Key, c.Value, null)).ToList());

    /// <summary>A 2000 x 2000 image with a rotated, slightly skewed CD matrix, about 1 arcsec per pixel unless <paramref name="scale"/> says otherwise.</summary>
    public static Dictionary<string, object> Celestial(string code, double crval1, double crval2, double scale = 2.8e-4) => new()
    {
        ["CTYPE1"] = $"RA---{code}",
        ["CTYPE2"] = $"DEC--{code}",
        ["CRPIX1"] = 1000.5,
        ["CRPIX2"] = 1020.25,
        ["CRVAL1"] = crval1,
        ["CRVAL2"] = crval2,
        ["CD1_1"] = -scale * 0.9659258,
        ["CD1_2"] = scale * 0.2588190,
        ["CD2_1"] = scale * 0.2600000,
        ["CD2_2"] = scale * 0.9659258,
    };
}
