namespace Mosaic.Fits.Compression;

/// <summary>One column of a binary table (FITS 4.0 section 7.3.1): where it sits in a row and what it holds.</summary>
/// <param name="Type">The TFORM data type letter; for a descriptor (P or Q) the letter of the array's elements.</param>
/// <param name="Offset">Byte offset of the field within a row.</param>
/// <param name="Descriptor">0 for a fixed field, else 32 (P) or 64 (Q): a variable-length array descriptor.</param>
internal sealed record TableColumn(int Number, string Name, char Type, long Repeat, long Offset, long Width, int Descriptor)
{
    /// <summary>Bytes of one element of this column's type (section 7.3.1, table 18); X counts bits, so 0.</summary>
    public static int ElementSize(char type) => type switch
    {
        'L' or 'B' or 'A' => 1,
        'I' => 2,
        'J' or 'E' => 4,
        'K' or 'D' or 'C' => 8,
        'M' => 16,
        _ => 0,
    };

    public int ElementBytes => ElementSize(Type);
}
