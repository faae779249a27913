namespace Mosaic.Imaging.Composite;

/// <summary>
/// The Lupton et al. (2004) composite as resolved for three bands: softening <see cref="Q"/>, the linear
/// <see cref="Range"/> of the stretch (astropy's make_lupton_rgb calls it stretch), each band's value shown as
/// black and each band's weight.
/// </summary>
public sealed record LuptonParameters(double Q, double Range, Channels<double> Minimum, Channels<double> Scale);
