namespace Mosaic.Wcs.Coordinates;

/// <summary>Text that is not a sky position: the message says what was wrong.</summary>
public sealed class PositionFormatException : FormatException
{
    public PositionFormatException(string message) : base(message)
    {
    }

    public PositionFormatException(string message, Exception innerException) : base(message, innerException)
    {
    }
}
