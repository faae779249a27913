namespace Mosaic.Fits.Compression;

/// <summary>A variable-length array in the heap: absolute file offset and length in bytes (0 for an empty array).</summary>
internal readonly record struct HeapSpan(long Offset, long Length)
{
    public bool IsEmpty => Length == 0;
}
