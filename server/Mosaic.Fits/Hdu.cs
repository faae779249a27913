namespace Mosaic.Fits;

/// <summary>One header-data unit of a FITS file.</summary>
public sealed class Hdu
{
    /// <param name="storedHeader">The header as written in the file, where it differs from <paramref name="header"/> (a compressed image's table header).</param>
    /// <param name="imageProblem">Why the HDU's image cannot be read by this reader, where it holds one that cannot.</param>
    public Hdu(int index, Header header, long headerOffset, long dataOffset, long dataLength, ImagePlane? image,
        Header? storedHeader = null, string? imageProblem = null)
    {
        Index = index;
        Header = header;
        StoredHeader = storedHeader ?? header;
        ImageProblem = imageProblem;
        HeaderOffset = headerOffset;
        DataOffset = dataOffset;
        DataLength = dataLength;
        Image = image;
    }

    /// <summary>0 is the primary HDU.</summary>
    public int Index { get; }

    /// <summary>
    /// The header of the HDU's content: for a tile-compressed image (FITS 4.0 section 10) the restored image header
    /// (BITPIX, NAXISn, EXTNAME, WCS... as before compression), else the header as stored.
    /// </summary>
    public Header Header { get; }

    /// <summary>The header exactly as stored in the file (for a tile-compressed image, the binary table's).</summary>
    public Header StoredHeader { get; }

    /// <summary>True for a tile-compressed image: <see cref="Header"/> is restored and the data are a binary table.</summary>
    public bool IsTileCompressed => !ReferenceEquals(StoredHeader, Header);

    /// <summary>Why the image this HDU holds cannot be read (for example a compression this reader does not decode); null otherwise.</summary>
    public string? ImageProblem { get; }

    public long HeaderOffset { get; }

    public long DataOffset { get; }

    /// <summary>Bytes of data as stored (for a compressed image, the table and its heap), without the padding to 2880.</summary>
    public long DataLength { get; }

    /// <summary>The first 2-D plane of a primary array, IMAGE extension or tile-compressed image with NAXIS ≥ 2 (a
    /// <see cref="RawImagePlane"/> or a <see cref="TiledImagePlane"/>); null otherwise.</summary>
    public ImagePlane? Image { get; }

    public string? ExtName => Header.GetString("EXTNAME")?.TrimEnd();

    /// <summary>"IMAGE", "BINTABLE", … for extensions; null for the primary HDU.</summary>
    public string? XTension => Header.GetString("XTENSION")?.TrimEnd();
}
