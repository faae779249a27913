using Mosaic.Wcs.Distortion;
using Mosaic.Wcs.Tests.Projections;

namespace Mosaic.Wcs.Tests.Distortion;

/// <summary>SIP (Shupe et al. 2005) against astropy.wcs all_pix2world / all_world2pix on the same cards.</summary>
public sealed class SipAgreementTests
{
    private static Dictionary<string, object> SipCards()
    {
        // A few pixels of distortion at the image corners, a made-up but typical magnitude (common practice).
        var cards = Cards.Celestial("TAN", 150.0, 35.0);
        cards["CTYPE1"] = "RA---TAN-SIP";
        cards["CTYPE2"] = "DEC--TAN-SIP";
        cards["A_ORDER"] = 3L;
        cards["A_2_0"] = 2.1e-6; cards["A_1_1"] = -1.3e-6; cards["A_0_2"] = 0.8e-6;
        cards["A_3_0"] = 1.5e-9; cards["A_1_2"] = -0.7e-9;
        cards["B_ORDER"] = 3L;
        cards["B_2_0"] = -0.9e-6; cards["B_1_1"] = 1.7e-6; cards["B_0_2"] = 2.4e-6;
        cards["B_0_3"] = -1.1e-9; cards["B_2_1"] = 0.6e-9;
        return cards;
    }

    [Fact]
    public void ForwardAndNewtonInverseAgreeWithAstropy() => AstropyAgreementTests.Check(SipCards());

    [Fact]
    public void InverseCoefficientsStartNewtonAndResultStaysExact()
    {
        var cards = SipCards();
        // First-order inverse terms (AP ~ -A): only a starting point, Newton refines it.
        cards["AP_ORDER"] = 2L;
        cards["AP_2_0"] = -2.1e-6; cards["AP_1_1"] = 1.3e-6; cards["AP_0_2"] = -0.8e-6;
        cards["BP_ORDER"] = 2L;
        cards["BP_2_0"] = 0.9e-6; cards["BP_1_1"] = -1.7e-6; cards["BP_0_2"] = -2.4e-6;
        Assert.True(SipDistortion.From(Cards.ToHeader(cards)).HasInverseCoefficients);
        AstropyAgreementTests.Check(cards);
        // Shupe et al. 2005 eq. 1-2 by hand at one pixel: offsets u = 200, v = -300 from CRPIX.
        double u = 200, v = -300;
        var f = 2.1e-6 * u * u - 1.3e-6 * u * v + 0.8e-6 * v * v + 1.5e-9 * u * u * u - 0.7e-9 * u * v * v;
        var sip = SipDistortion.From(Cards.ToHeader(cards));
        Assert.Equal(u + f, sip.Forward(u, v).U, 12);
    }
}
