namespace Mosaic.Imaging.Display.Stretches;

/// <summary>How a softening amount is measured.</summary>
public enum SofteningUnit
{
    /// <summary>Physical pixel units (after BSCALE/BZERO).</summary>
    Physical,

    /// <summary>Multiples of the band's MAD sigma, so one setting suits fields of any depth.</summary>
    Sigma,
}
