using Mosaic.Demo.Scene;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Tests.Units;

/// <summary>The fitted inverse SIP of every preset, checked point by point against the forward polynomial.</summary>
public sealed class SipTests
{
    public static TheoryData<string> Presets() => new() { "small", "default", "large" };

    [Theory]
    [MemberData(nameof(Presets))]
    public void AP_BP_undo_A_B_to_a_hundredth_of_a_pixel_over_every_chip(string preset)
    {
        var options = preset switch
        {
            "small" => DemoFieldOptions.Small("x"),
            "default" => DemoFieldOptions.Default("x"),
            _ => DemoFieldOptions.Large("x"),
        };
        var scene = DemoScene.Build(options);
        foreach (var chip in scene.Chips)
        {
            var w = chip.Wcs;
            double worst = 0;
            for (var i = 0; i <= 32; i++)
            for (var j = 0; j <= 32; j++)
            {
                // SIP (Shupe et al. 2005): U = u + A(u, v); the inverse claims u = U + AP(U, V).
                var u = -0.5 + (chip.Width) * i / 32.0 + 1 - w.ReferencePixel1;
                var v = -0.5 + (chip.Height) * j / 32.0 + 1 - w.ReferencePixel2;
                var uu = u + w.A.Evaluate(u, v);
                var vv = v + w.B.Evaluate(u, v);
                var du = uu + w.Ap.Evaluate(uu, vv) - u;
                var dv = vv + w.Bp.Evaluate(uu, vv) - v;
                worst = Math.Max(worst, Math.Sqrt(du * du + dv * dv));
            }
            Assert.True(worst < 0.01, $"{preset} {chip.ExtName}: inverse SIP residual {worst:F5} px");
            Assert.True(chip.InverseSipResidualPixels < 0.01);
        }
    }

    [Fact]
    public void Sky_to_pixel_inverts_pixel_to_sky_exactly()
    {
        var scene = DemoScene.Build(DemoFieldOptions.Default("x"));
        foreach (var chip in scene.Chips)
        foreach (var p in new[] { new PixelPosition(0, 0), new PixelPosition(chip.Width - 1, chip.Height - 1), new PixelPosition(17.25, 3001.5) })
        {
            var back = chip.Wcs.SkyToPixel(chip.Wcs.PixelToSky(p));
            Assert.Equal(p.X, back.X, 6);
            Assert.Equal(p.Y, back.Y, 6);
        }
    }
}
