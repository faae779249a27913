using Mosaic.Demo.Camera;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Wcs;
using Mosaic.Fits;

namespace Mosaic.Demo.Output;

/// <summary>The header cards of a band file: the primary HDU (scenario, band, exposure) and each chip's extension (electronics and WCS).</summary>
internal static class FieldHeaders
{
    public static List<HeaderCard> Primary(DemoScene scene, int bandIndex)
    {
        var band = scene.Options.Bands[bandIndex];
        var centre = scene.FieldCentre;
        return
        [
            new("OBSERVAT", DemoScenario.Observatory, "fictional site"),
            new("TELESCOP", DemoScenario.Telescope, null),
            new("INSTRUME", DemoScenario.Instrument, null),
            new("OBJECT", DemoScenario.Target, "invented field name"),
            new("FILTER", band.Name, "pass band"),
            new("EXPTIME", band.ExposureSeconds, "[s] exposure time"),
            new("DATE-OBS", DemoScenario.DateObs, "[UTC] start of exposure (invented)"),
            new("RA", centre.RaDegrees, "[deg] pointing, ICRS"),
            new("DEC", centre.DecDegrees, "[deg] pointing, ICRS"),
            new("RADESYS", "ICRS", null),
            new("EQUINOX", 2000.0, null),
            new("NEXTEND", (long)scene.Chips.Count, "number of chip extensions"),
            new("PIXSCALE", DemoScene.PixelScaleArcsec, "[arcsec/pixel] nominal"),
            new("ORIGIN", DemoScenario.Origin, null),
            new("DEMOSEED", scene.Options.Seed, "generator seed"),
            new("COMMENT", null, "Synthetic data: every star, galaxy and nebula here is simulated, and the"),
            new("COMMENT", null, "observatory, telescope, camera and field names are invented."),
        ];
    }

    public static List<HeaderCard> Chip(DemoScene scene, int bandIndex, ChipLayout chip)
    {
        var band = scene.Options.Bands[bandIndex];
        var wcs = chip.Wcs;
        var cards = new List<HeaderCard>
        {
            new("EXTNAME", chip.ExtName, "chip name"),
            new("CHIPCOL", (long)chip.Column + 1, "column in the chip grid, 1 = east"),
            new("CHIPROW", (long)chip.Row + 1, "row in the chip grid, 1 = south"),
            new("BUNIT", "adu", null),
            new("FILTER", band.Name, "pass band"),
            new("EXPTIME", band.ExposureSeconds, "[s] exposure time"),
            new("GAIN", chip.Gain, "[e-/adu]"),
            new("RDNOISE", chip.ReadNoiseElectrons, "[e-] read noise"),
            new("SATURATE", chip.SaturateAdu, "[adu] at and above: stored as NaN"),
            new("WCSAXES", 2L, null),
            new("RADESYS", "ICRS", null),
            new("EQUINOX", 2000.0, null),
            new("CTYPE1", "RA---TAN-SIP", null),
            new("CTYPE2", "DEC--TAN-SIP", null),
            new("CUNIT1", "deg", null),
            new("CUNIT2", "deg", null),
            new("CRVAL1", wcs.ReferenceValue.RaDegrees, "[deg] field centre"),
            new("CRVAL2", wcs.ReferenceValue.DecDegrees, "[deg] field centre"),
            new("CRPIX1", wcs.ReferencePixel1, "boresight in this chip's pixels"),
            new("CRPIX2", wcs.ReferencePixel2, "boresight in this chip's pixels"),
            new("CD1_1", wcs.Cd11, null),
            new("CD1_2", wcs.Cd12, null),
            new("CD2_1", wcs.Cd21, null),
            new("CD2_2", wcs.Cd22, null),
        };
        AddPolynomial(cards, "A", wcs.A, 2);
        AddPolynomial(cards, "B", wcs.B, 2);
        AddPolynomial(cards, "AP", wcs.Ap, 0);
        AddPolynomial(cards, "BP", wcs.Bp, 0);
        cards.Add(new("COMMENT", null, "Synthetic data. A/B: the camera's radial distortion about the boresight."));
        cards.Add(new("COMMENT", null, "AP/BP: least-squares inverse of A/B over this chip."));
        return cards;
    }

    private static void AddPolynomial(List<HeaderCard> cards, string name, SipPolynomial polynomial, int minimumDegree)
    {
        cards.Add(new($"{name}_ORDER", (long)polynomial.Order, null));
        foreach (var (p, q, c) in polynomial.Terms(minimumDegree))
            cards.Add(new($"{name}_{p}_{q}", c, null));
    }
}
