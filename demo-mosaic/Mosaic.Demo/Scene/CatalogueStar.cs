using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>A star of the synthetic sky.</summary>
/// <param name="Magnitude">Catalogue magnitude; a band sees Magnitude + ColourTerm × ColourIndex.</param>
/// <param name="FluxElectrons">Total electrons in each band of the field, in the order of the options' bands.</param>
/// <param name="Placed">True for the few bright stars placed on purpose (saturation, bleeding, the ghost).</param>
public sealed record CatalogueStar(int Id, SkyCoordinate Position, double Magnitude, double ColourIndex,
    IReadOnlyList<double> FluxElectrons, bool Placed);
