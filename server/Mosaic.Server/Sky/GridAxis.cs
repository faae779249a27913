namespace Mosaic.Server.Sky;

/// <summary>Which coordinate a grid line holds constant.</summary>
public enum GridAxis
{
    /// <summary>A meridian: constant right ascension.</summary>
    Ra,

    /// <summary>A parallel: constant declination.</summary>
    Dec,
}
