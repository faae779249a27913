namespace Mosaic.Wcs.Coordinates;

/// <summary>The celestial reference system a header's longitude/latitude axes are written in (FITS WCS Paper I section 3.1, Paper II section 3.1).</summary>
public enum CelestialFrameKind
{
    /// <summary>International Celestial Reference System: RADESYS = 'ICRS', or RA/DEC axes with neither RADESYS nor EQUINOX.</summary>
    Icrs,

    /// <summary>FK5 mean equator and equinox of a Julian epoch (RADESYS = 'FK5', or EQUINOX of 1984 or later).</summary>
    Fk5,

    /// <summary>IAU 1958 Galactic coordinates (GLON/GLAT axes).</summary>
    Galactic,
}
