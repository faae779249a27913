namespace Mosaic.Wcs.Coordinates;

/// <summary>The unit mark written right after a number in typed text.</summary>
internal enum FieldMark
{
    None,
    Colon,
    Hours,
    Degrees,
    Minutes,
    Seconds,
}
