namespace Mosaic.Fits;

/// <summary>One header-data unit of a FITS file.</summary>
public sealed class Hdu
{
    public Hdu(int index, Header header, long headerOffset, long dataOffset, long dataLength, ImagePlane? image)
    {
        Index = index;
        Header = header;
        HeaderOffset = headerOffset;
        DataOffset = dataOffset;
        DataLength = dataLength;
        Image = image;
    }

    /// <summary>0 is the primary HDU.</summary>
    public int Index { get; }

    public Header Header { get; }

    public long HeaderOffset { get; }

    public long DataOffset { get; }

    /// <summary>Bytes of data, without the padding to 2880.</summary>
    public long DataLength { get; }

    /// <summary>The first 2-D plane of a primary array or IMAGE extension with NAXIS ≥ 2; null otherwise.</summary>
    public ImagePlane? Image { get; }

    public string? ExtName => Header.GetString("EXTNAME")?.TrimEnd();

    /// <summary>"IMAGE", "BINTABLE", … for extensions; null for the primary HDU.</summary>
    public string? XTension => Header.GetString("XTENSION")?.TrimEnd();
}
