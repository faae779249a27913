using Mosaic.Demo.Tests.Support;

namespace Mosaic.Demo.Tests;

/// <summary>The nebula's structure differs between bands, measured with numpy on astropy-read data (Debian).</summary>
[Collection(SmallFieldCollection.Name)]
public sealed class NebulaTests(SmallField field)
{
    [Fact]
    public void Red_to_green_ratio_is_much_higher_on_the_shell_than_in_the_core_and_blue_is_faint()
    {
        var scene = field.Scene;
        var nebula = scene.Nebula;
        var exts = scene.Chips.Select(c => c.ExtName).ToArray();
        var centre = new[] { nebula.Centre.RaDegrees, nebula.Centre.DecDegrees };
        var bands = new[] { "blue", "green", "red" };
        var operations = new List<object>();
        foreach (var band in bands)
        {
            operations.Add(new { op = "annulus_median", file = field.FileOf(band), exts, centre, rMin = 0.0, rMax = 0.5 * nebula.CoreRadiusArcsec });
            operations.Add(new { op = "annulus_median", file = field.FileOf(band), exts, centre, rMin = 0.85 * nebula.ShellRadiusArcsec, rMax = 1.15 * nebula.ShellRadiusArcsec });
        }
        var results = AstropyProbe.Run(operations.ToArray());

        var (xi, eta) = Sky.Tangent(scene.FieldCentre, nebula.Centre.RaDegrees, nebula.Centre.DecDegrees);
        var core = new double[3];
        var shell = new double[3];
        for (var b = 0; b < 3; b++)
        {
            var index = scene.Options.Bands.ToList().FindIndex(x => x.Name == bands[b]);
            var sky = scene.Backgrounds[index].ElectronsAt(xi, eta);
            Assert.True((int)results[2 * b]!["count"]! > 100, $"{bands[b]}: too few core pixels");
            Assert.True((int)results[2 * b + 1]!["count"]! > 1000, $"{bands[b]}: too few shell pixels");
            core[b] = (double)results[2 * b]!["median"]! - sky;
            shell[b] = (double)results[2 * b + 1]!["median"]! - sky;
        }
        const int blue = 0, green = 1, red = 2;
        Assert.True(core[green] > 0 && shell[red] > 0, $"core (green) {core[green]:F0} e-, shell (red) {shell[red]:F0} e-");
        var coreRatio = core[red] / core[green];
        var shellRatio = shell[red] / shell[green];
        Assert.True(shellRatio > 3 * coreRatio, $"red/green is {shellRatio:F2} on the shell and {coreRatio:F2} in the core");
        Assert.True(shell[blue] < 0.3 * shell[red], $"blue shell {shell[blue]:F0} e- should be faint next to red {shell[red]:F0} e-");
        Assert.True(core[blue] < 0.5 * core[green], $"blue core {core[blue]:F0} e- should be faint next to green {core[green]:F0} e-");
    }
}
