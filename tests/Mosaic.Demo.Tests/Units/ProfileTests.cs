using Mosaic.Demo.Rendering;

namespace Mosaic.Demo.Tests.Units;

/// <summary>The star and galaxy profiles against their defining properties.</summary>
public sealed class ProfileTests
{
    [Theory]
    [InlineData(3.3, 2.85)]
    [InlineData(3.9, 3.2)]
    [InlineData(2.0, 4.5)]
    public void Moffat_is_at_half_peak_at_half_the_FWHM_and_integrates_to_one(double fwhm, double beta)
    {
        // Moffat (1969): I(r) ∝ (1 + r²/α²)^−β; FWHM is where it is half of I(0) (definition of FWHM).
        var alpha = MoffatProfile.Alpha(fwhm, beta);
        var half = Math.Pow(1 + Math.Pow(fwhm / 2 / alpha, 2), -beta);
        Assert.Equal(0.5, half, 12);

        // ∫ I 2πr dr numerically, far into the wings: the peak fraction normalises the total to 1.
        var peak = MoffatProfile.PeakFraction(fwhm, beta);
        double total = 0;
        const double dr = 0.001;
        for (var r = dr / 2; r < 4000 * alpha; r += dr * (1 + r))
        {
            var step = dr * (1 + r);
            total += peak * Math.Pow(1 + r * r / (alpha * alpha), -beta) * 2 * Math.PI * r * step;
        }
        Assert.Equal(1.0, total, 3);
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(4.0)]
    public void Sersic_b_puts_half_the_light_inside_the_effective_radius(double n)
    {
        // Definition of the effective radius: γ(2n, b_n) = Γ(2n)/2 (Ciotti & Bertin 1999). Integrate numerically.
        var b = GalaxyStamp.SersicB(n);
        double inside = 0, total = 0;
        const int steps = 400_000;
        var rMax = 60.0;
        for (var i = 0; i < steps; i++)
        {
            var r = (i + 0.5) * rMax / steps;
            var ring = Math.Exp(-b * Math.Pow(r, 1 / n)) * r;
            total += ring;
            if (r < 1) inside += ring;
        }
        Assert.Equal(0.5, inside / total, 3);
    }

    [Theory]
    [InlineData(1.0, 6.0, 1.0)]
    [InlineData(4.0, 3.0, 0.7)]
    public void Sersic_total_flux_matches_direct_integration_of_the_profile(double n, double re, double q)
    {
        // ∫ Ie exp(−b((r/re)^(1/n) − 1)) 2π q r dr to far beyond the profile, on a logarithmic grid.
        var b = GalaxyStamp.SersicB(n);
        double total = 0;
        for (var t = Math.Log(1e-6); t < Math.Log(1e5 * re); t += 1e-4)
        {
            var r = Math.Exp(t);
            total += Math.Exp(-b * (Math.Pow(r / re, 1 / n) - 1)) * 2 * Math.PI * q * r * r * 1e-4;
        }
        var formula = GalaxyStamp.TotalFluxPerUnitIe(n, re, q);
        Assert.Equal(1.0, formula / total, 4);
    }

    [Fact]
    public void An_exponential_disc_stamp_holds_the_flux_its_closed_form_encloses()
    {
        // Exponential disc (n = 1): L(<R) / L = 1 − e^−x (1 + x), x = b R / re (closed form, common practice).
        // The stamp is cut at 5 re and blurred by the seeing, which conserves flux.
        const int size = 400;
        var image = new float[size * size];
        const double flux = 1e6, re = 12;
        new GalaxyStamp().Add(image, size, size, 200.3, 199.6, flux, 1, re, 0.6, 0.7, 3.5);
        var x = GalaxyStamp.SersicB(1) * 5;
        var expected = flux * (1 - Math.Exp(-x) * (1 + x));
        Assert.Equal(expected, image.Sum(v => (double)v), expected * 0.005);
    }

    [Fact]
    public void A_star_stamp_holds_its_flux_and_is_centred_where_asked()
    {
        const int size = 200;
        var image = new float[size * size];
        const double flux = 5e5;
        var radius = ChipRenderer.StampRadius(flux, DemoBand.Green);
        StarStamp.Add(image, size, size, 90.3, 110.8, flux, DemoBand.Green.PsfFwhmPixels, DemoBand.Green.PsfBeta, radius);
        double sum = 0, sx = 0, sy = 0;
        for (var y = 0; y < size; y++)
        for (var xx = 0; xx < size; xx++)
        {
            double v = image[y * size + xx];
            sum += v; sx += v * xx; sy += v * y;
        }
        // Point sampling of a profile a few pixels wide keeps the flux to well under a percent.
        Assert.Equal(flux, sum, flux * 0.01);
        Assert.Equal(90.3, sx / sum, 2);
        Assert.Equal(110.8, sy / sum, 2);
    }
}
