namespace Mosaic.Demo.Nebulae;

/// <summary>The nebula's three emission components at one point, each roughly in [0, 1]; bands weight them differently.</summary>
internal readonly record struct NebulaComponents(double Shell, double Core, double Diffuse)
{
    public double InBand(DemoBand band) =>
        band.NebulaShellElectrons * Shell + band.NebulaCoreElectrons * Core + band.NebulaDiffuseElectrons * Diffuse;
}
