namespace Mosaic.Demo.Scene;

/// <summary>
/// The sky level of one band, a plane in the intermediate coordinates (ξ east, η north, degrees, TAN about the field
/// centre): CentreElectrons × (1 + GradientEastPerDegree ξ + GradientNorthPerDegree η).
/// </summary>
public sealed record SkyBackground(double CentreElectrons, double GradientEastPerDegree, double GradientNorthPerDegree)
{
    public double ElectronsAt(double xiDegrees, double etaDegrees) =>
        CentreElectrons * (1 + GradientEastPerDegree * xiDegrees + GradientNorthPerDegree * etaDegrees);
}
